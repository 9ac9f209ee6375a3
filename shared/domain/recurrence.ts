// Recurrence and wall-clock ↔ UTC conversion for the Rota.
//
// Occurrences are computed in LOCAL WALL TIME: a rule's dates are produced by rrule on
// "floating" dates (wall-clock values stored in a Date's UTC fields), so a daylight-saving
// change can never move an occurrence to another day or hour. Only afterwards is each
// local date + time converted to UTC in the site's zone (luxon's IANA zone data).
//
// Nonexistent and repeated local times follow RFC 5545 §3.3.5:
// - a time inside a spring-forward gap is read with the offset before the gap, which moves it
//   forward by the gap's length (02:30 on 8 March 2026 in Los Angeles → 03:30 PDT);
// - a time that happens twice at fall-back is the first occurrence, i.e. the earlier
//   instant with the daylight offset (01:30 on 1 November 2026 in Los Angeles → 01:30 PDT).
//   Luxon on its own picks the later one, so we resolve both cases ourselves.

import { IANAZone } from 'luxon'
import * as rruleModule from 'rrule'
import type { IsoWeekday, LocalDate, LocalTime } from '../types/rota'

// Why: rrule ships CommonJS as "main" (what Node and vitest load) and extensionless ESM as
// "module" (what bundlers load). Under Node's ESM loader the named exports sit on `default`.
type RRuleExports = typeof rruleModule
function resolveRRuleExports(): RRuleExports {
  if (typeof rruleModule.RRule === 'function') return rruleModule
  return (rruleModule as unknown as { default: RRuleExports }).default
}
const { RRule } = resolveRRuleExports()

const MINUTE_MS = 60_000
export const DAY_MS = 86_400_000

// ---------------------------------------------------------------------------
// Local calendar arithmetic on "wall milliseconds" (wall-clock fields read as if UTC).
// ---------------------------------------------------------------------------

const LOCAL_DATE_PATTERN = /^(\d{4})-(\d{2})-(\d{2})$/
const LOCAL_TIME_PATTERN = /^(\d{2}):(\d{2})$/

// Expansion parses the same few hundred dates over and over; remember them (bounded).
const wallMidnightMemo = new Map<string, number>()
const MEMO_LIMIT = 20_000

function remember<V>(memo: Map<string, V>, key: string, value: V): V {
  if (memo.size >= MEMO_LIMIT) memo.clear()
  memo.set(key, value)
  return value
}

/** Midnight of a local date as wall milliseconds. Throws on a malformed or impossible date. */
export function wallMidnightMs(date: LocalDate): number {
  const known = wallMidnightMemo.get(date)
  return known !== undefined ? known : remember(wallMidnightMemo, date, parseWallMidnight(date))
}

function parseWallMidnight(date: LocalDate): number {
  const match = LOCAL_DATE_PATTERN.exec(date)
  if (!match) throw new RangeError(`Local date "${date}" is not YYYY-MM-DD`)
  const year = Number(match[1])
  const month = Number(match[2])
  const day = Number(match[3])
  const ms = Date.UTC(year, month - 1, day)
  const check = new Date(ms)
  // Date.UTC rolls 2026-02-30 over to March; a round trip catches it.
  if (check.getUTCFullYear() !== year || check.getUTCMonth() !== month - 1 || check.getUTCDate() !== day) {
    throw new RangeError(`Local date "${date}" does not exist`)
  }
  return ms
}

function pad2(n: number): string {
  return n < 10 ? `0${n}` : String(n)
}

/** The local date of a wall-milliseconds value. */
export function wallDateOf(wallMs: number): LocalDate {
  const d = new Date(wallMs)
  return `${String(d.getUTCFullYear()).padStart(4, '0')}-${pad2(d.getUTCMonth() + 1)}-${pad2(d.getUTCDate())}`
}

export function addDays(date: LocalDate, days: number): LocalDate {
  return wallDateOf(wallMidnightMs(date) + days * DAY_MS)
}

/** ISO weekday (1 = Monday … 7 = Sunday) of a local date. */
export function isoWeekdayOf(date: LocalDate): IsoWeekday {
  return (((new Date(wallMidnightMs(date)).getUTCDay() + 6) % 7) + 1) as IsoWeekday
}

/** Every local date from `from` to `to`, both inclusive. */
export function eachLocalDate(from: LocalDate, to: LocalDate): LocalDate[] {
  const dates: LocalDate[] = []
  const end = wallMidnightMs(to)
  for (let ms = wallMidnightMs(from); ms <= end; ms += DAY_MS) dates.push(wallDateOf(ms))
  return dates
}

const minutesOfDayMemo = new Map<string, number>()

/** Minutes after local midnight for 'HH:mm'; '24:00' (end of day) is allowed. */
export function minutesOfDay(time: LocalTime): number {
  const known = minutesOfDayMemo.get(time)
  return known !== undefined ? known : remember(minutesOfDayMemo, time, parseMinutesOfDay(time))
}

function parseMinutesOfDay(time: LocalTime): number {
  const match = LOCAL_TIME_PATTERN.exec(time)
  const hours = Number(match?.[1])
  const minutes = Number(match?.[2])
  const valid = match !== null && minutes < 60 && (hours < 24 || (hours === 24 && minutes === 0))
  if (!valid) throw new RangeError(`Local time "${time}" is not HH:mm`)
  return hours * 60 + minutes
}

// ---------------------------------------------------------------------------
// Zone offsets. Intl lookups cost microseconds each, so each zone's offset changes are
// found once per UTC year and remembered; tz data does not change while a process runs.
// ---------------------------------------------------------------------------

interface YearOffsets {
  startMs: number
  endMs: number
  startOffset: number
  changes: Array<{ atMs: number; offset: number }>
}

interface ZoneOffsets {
  iana: IANAZone
  years: Map<number, YearOffsets>
  /** The table used last; consecutive lookups nearly always fall in the same year. */
  last: YearOffsets | null
}

const zoneOffsetsCache = new Map<string, ZoneOffsets>()
// Assumes no zone changes offset twice within one sampling step (true of the tz database
// for modern dates; the closest real changes are weeks apart).
const SAMPLE_STEP_MS = 7 * DAY_MS

function zoneOffsets(zone: string): ZoneOffsets {
  let entry = zoneOffsetsCache.get(zone)
  if (!entry) {
    const iana = IANAZone.create(zone)
    if (!iana.isValid) throw new RangeError(`Unknown time zone "${zone}"`)
    entry = { iana, years: new Map(), last: null }
    zoneOffsetsCache.set(zone, entry)
  }
  return entry
}

/** Finds the first whole minute in (loMs, hiMs] whose offset differs from the offset at loMs. */
function findOffsetChange(iana: IANAZone, loMs: number, hiMs: number): number {
  const before = iana.offset(loMs)
  let lo = Math.floor(loMs / MINUTE_MS)
  let hi = Math.ceil(hiMs / MINUTE_MS)
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2)
    if (iana.offset(mid * MINUTE_MS) === before) lo = mid
    else hi = mid
  }
  return hi * MINUTE_MS
}

function computeYearOffsets(iana: IANAZone, year: number): YearOffsets {
  const startMs = Date.UTC(year, 0, 1)
  const endMs = Date.UTC(year + 1, 0, 1)
  const startOffset = iana.offset(startMs)
  const changes: YearOffsets['changes'] = []
  let previousMs = startMs
  let previousOffset = startOffset
  while (previousMs < endMs) {
    const sampleMs = Math.min(previousMs + SAMPLE_STEP_MS, endMs)
    const sampleOffset = iana.offset(sampleMs)
    if (sampleOffset !== previousOffset) {
      const atMs = findOffsetChange(iana, previousMs, sampleMs)
      changes.push({ atMs, offset: iana.offset(atMs) })
    }
    previousMs = sampleMs
    previousOffset = sampleOffset
  }
  return { startMs, endMs, startOffset, changes }
}

function yearOffsetsAt(zone: string, utcMs: number): YearOffsets {
  const entry = zoneOffsets(zone)
  const last = entry.last
  if (last && utcMs >= last.startMs && utcMs < last.endMs) return last
  const year = new Date(utcMs).getUTCFullYear()
  let table = entry.years.get(year)
  if (!table) {
    table = computeYearOffsets(entry.iana, year)
    entry.years.set(year, table)
  }
  entry.last = table
  return table
}

/** UTC offset in minutes (e.g. −420 for PDT) of `zone` at the UTC instant `utcMs`. */
export function offsetMinutesAt(zone: string, utcMs: number): number {
  const table = yearOffsetsAt(zone, utcMs)
  let offset = table.startOffset
  for (const change of table.changes) {
    if (utcMs >= change.atMs) offset = change.offset
  }
  return offset
}

function readsAs(zone: string, wallMs: number, offset: number): boolean {
  return offsetMinutesAt(zone, wallMs - offset * MINUTE_MS) === offset
}

/**
 * Converts wall milliseconds in `zone` to a UTC instant (RFC 5545 §3.3.5):
 * gap → read with the offset before the gap (moves forward); repeated → the earlier instant.
 */
export function wallToUtcMs(wallMs: number, zone: string): number {
  // Offsets a day either side bracket any single change near this wall time.
  const offsetBefore = offsetMinutesAt(zone, wallMs - DAY_MS)
  const offsetAfter = offsetMinutesAt(zone, wallMs + DAY_MS)
  if (offsetBefore === offsetAfter && readsAs(zone, wallMs, offsetBefore)) {
    return wallMs - offsetBefore * MINUTE_MS
  }
  const beforeFits = readsAs(zone, wallMs, offsetBefore)
  const afterFits = readsAs(zone, wallMs, offsetAfter)
  if (beforeFits && afterFits) {
    return Math.min(wallMs - offsetBefore * MINUTE_MS, wallMs - offsetAfter * MINUTE_MS)
  }
  if (afterFits) return wallMs - offsetAfter * MINUTE_MS
  // In a gap (or the before offset fits alone): the offset before the change.
  return wallMs - offsetBefore * MINUTE_MS
}

/** UTC epoch milliseconds of a local date and time in `zone`. */
export function localToUtcMs(date: LocalDate, time: LocalTime, zone: string): number {
  return wallToUtcMs(wallMidnightMs(date) + minutesOfDay(time) * MINUTE_MS, zone)
}

/** UTC ISO instant (ending in 'Z') of a local date and time in `zone`. */
export function localToUtc(date: LocalDate, time: LocalTime, zone: string): string {
  return new Date(localToUtcMs(date, time, zone)).toISOString()
}

/** The local date in `zone` at a UTC instant. */
export function localDateAt(utcMs: number, zone: string): LocalDate {
  return wallDateOf(utcMs + offsetMinutesAt(zone, utcMs) * MINUTE_MS)
}

// ---------------------------------------------------------------------------
// Rules
// ---------------------------------------------------------------------------

const SUPPORTED_FREQUENCIES = new Set(['DAILY', 'WEEKLY', 'MONTHLY', 'YEARLY'])
const SUB_DAILY_FREQUENCIES = new Set(['SECONDLY', 'MINUTELY', 'HOURLY'])
const DATE_PART_KEYS = new Set(['FREQ', 'INTERVAL', 'COUNT', 'BYDAY', 'BYMONTHDAY', 'BYMONTH', 'BYSETPOS', 'BYYEARDAY', 'BYWEEKNO', 'WKST'])
const WEEKDAY_CODES = ['MO', 'TU', 'WE', 'TH', 'FR', 'SA', 'SU'] as const
type WeekdayCode = (typeof WEEKDAY_CODES)[number]
const BYDAY_PATTERN = /^([+-]?\d{1,2})?(MO|TU|WE|TH|FR|SA|SU)$/
const INTEGER_LIST_PATTERN = /^[+-]?\d{1,3}(,[+-]?\d{1,3})*$/

function stripRulePrefix(rrule: string): string {
  return rrule.trim().replace(/^RRULE:/i, '')
}

/** Splits 'FREQ=WEEKLY;BYDAY=MO' into upper-cased key → value; null when malformed or repeated. */
function ruleParts(rrule: string): Map<string, string> | null {
  const parts = new Map<string, string>()
  for (const piece of stripRulePrefix(rrule).split(';')) {
    const [rawKey, rawValue, extra] = piece.split('=')
    if (!rawKey || rawValue === undefined || rawValue === '' || extra !== undefined) return null
    const key = rawKey.trim().toUpperCase()
    if (parts.has(key)) return null
    parts.set(key, rawValue.trim().toUpperCase())
  }
  return parts
}

function isPositiveInteger(value: string): boolean {
  return /^\d+$/.test(value) && Number(value) > 0
}

function bydayReason(value: string, freq: string): string | null {
  for (const token of value.split(',')) {
    const match = BYDAY_PATTERN.exec(token)
    if (!match) return `"${token}" is not a weekday such as MO or 1MO.`
    // RFC 5545 §3.3.10: numbered weekdays only with MONTHLY or YEARLY.
    if (match[1] !== undefined && freq !== 'MONTHLY' && freq !== 'YEARLY') {
      return 'Numbered weekdays (such as 1MO) need a monthly or yearly rule.'
    }
  }
  return null
}

/** Why a rule cannot be used, in plain English; null when it is fine. */
export function validateRule(rrule: string): string | null {
  if (stripRulePrefix(rrule) === '') return 'The rule is empty.'
  if (/DTSTART/i.test(rrule)) return 'Put the first date in the start date, not DTSTART inside the rule.'
  if (/[\r\n]/.test(rrule)) return 'The rule must be a single RRULE value.'
  const parts = ruleParts(rrule)
  if (!parts) return 'The rule is not a list of NAME=value parts separated by ";", each named once.'
  if (parts.has('COUNT') && parts.has('UNTIL')) return 'A rule may end by COUNT or by UNTIL, not both (RFC 5545 §3.3.10).'
  if (parts.has('UNTIL')) return 'Put the last date in the until date, not UNTIL inside the rule.'
  const freq = parts.get('FREQ')
  if (!freq) return 'The rule needs a FREQ.'
  if (SUB_DAILY_FREQUENCIES.has(freq)) return 'Repeating more often than daily is not supported; a shift sets its own hours.'
  if (!SUPPORTED_FREQUENCIES.has(freq)) return `FREQ=${freq} is not a known frequency.`
  for (const key of parts.keys()) {
    if (key === 'BYHOUR' || key === 'BYMINUTE' || key === 'BYSECOND') {
      return `${key} is not supported; the time of day comes from the start and end times.`
    }
    if (!DATE_PART_KEYS.has(key)) return `${key} is not a supported rule part.`
  }
  for (const key of ['INTERVAL', 'COUNT'] as const) {
    const value = parts.get(key)
    if (value !== undefined && !isPositiveInteger(value)) return `${key} must be a whole number above zero.`
  }
  const byday = parts.get('BYDAY')
  if (byday !== undefined) {
    const reason = bydayReason(byday, freq)
    if (reason) return reason
  }
  for (const key of ['BYMONTHDAY', 'BYMONTH', 'BYSETPOS', 'BYYEARDAY', 'BYWEEKNO'] as const) {
    const value = parts.get(key)
    if (value !== undefined && !INTEGER_LIST_PATTERN.test(value)) return `${key} must be a list of whole numbers.`
  }
  const wkst = parts.get('WKST')
  if (wkst !== undefined && !WEEKDAY_CODES.includes(wkst as WeekdayCode)) return 'WKST must be a weekday such as MO.'
  try {
    RRule.parseString(stripRulePrefix(rrule))
  } catch (error) {
    return `The rule could not be read (${error instanceof Error ? error.message : String(error)}).`
  }
  return null
}

type RuleOptions = ReturnType<typeof RRule.parseString>

/**
 * The shape nearly every shift and block has: DAILY or WEEKLY, optional INTERVAL, plain BYDAY
 * and WKST, no COUNT. Its dates are simple arithmetic, so we skip rrule's general iterator
 * (tests compare both paths on random rules).
 */
interface SimpleRule {
  unitDays: 1 | 7
  interval: number
  weekdays: ReadonlySet<IsoWeekday> | null
  weekStart: IsoWeekday
}

interface ParsedRule {
  options: RuleOptions
  simple: SimpleRule | null
}

const parsedRuleMemo = new Map<string, ParsedRule>()
const SIMPLE_RULE_KEYS = new Set(['FREQ', 'INTERVAL', 'BYDAY', 'WKST'])

function isoWeekdayOfCode(code: string): IsoWeekday {
  return (WEEKDAY_CODES.indexOf(code as WeekdayCode) + 1) as IsoWeekday
}

function simpleShape(parts: Map<string, string>): SimpleRule | null {
  const freq = parts.get('FREQ')
  if ((freq !== 'DAILY' && freq !== 'WEEKLY') || [...parts.keys()].some((key) => !SIMPLE_RULE_KEYS.has(key))) return null
  const byday = parts.get('BYDAY')
  const codes = byday === undefined ? [] : byday.split(',')
  if (codes.some((code) => !WEEKDAY_CODES.includes(code as WeekdayCode))) return null
  return {
    unitDays: freq === 'DAILY' ? 1 : 7,
    interval: Number(parts.get('INTERVAL') ?? '1'),
    weekdays: codes.length === 0 ? null : new Set(codes.map(isoWeekdayOfCode)),
    weekStart: isoWeekdayOfCode(parts.get('WKST') ?? 'MO'),
  }
}

function parseValidRule(rrule: string): ParsedRule {
  const known = parsedRuleMemo.get(rrule)
  if (known) return known
  const reason = validateRule(rrule)
  if (reason) throw new RangeError(`Invalid rule "${rrule}": ${reason}`)
  const parts = ruleParts(rrule)
  const parsed: ParsedRule = {
    options: RRule.parseString(stripRulePrefix(rrule)),
    simple: parts ? simpleShape(parts) : null,
  }
  return remember(parsedRuleMemo, rrule, parsed)
}

function isoWeekdayOfWallMs(wallMs: number): IsoWeekday {
  // 1970-01-01 was a Thursday (ISO 4).
  return (((((Math.floor(wallMs / DAY_MS) + 3) % 7) + 7) % 7) + 1) as IsoWeekday
}

function weekStartMs(wallMs: number, weekStart: IsoWeekday): number {
  return wallMs - ((isoWeekdayOfWallMs(wallMs) - weekStart + 7) % 7) * DAY_MS
}

/** RFC 5545 §3.3.10 for the simple shape: weekly periods begin on WKST, counted from DTSTART's period. */
function simpleOccurrences(rule: SimpleRule, dtstartMs: number, firstMs: number, lastMs: number): LocalDate[] {
  const weekdays = rule.weekdays ?? (rule.unitDays === 7 ? new Set([isoWeekdayOfWallMs(dtstartMs)]) : null)
  const periodZeroMs = rule.unitDays === 7 ? weekStartMs(dtstartMs, rule.weekStart) : dtstartMs
  const periodMs = rule.unitDays * DAY_MS
  const dates: LocalDate[] = []
  for (let ms = firstMs; ms <= lastMs; ms += DAY_MS) {
    if (weekdays && !weekdays.has(isoWeekdayOfWallMs(ms))) continue
    const periodStart = rule.unitDays === 7 ? weekStartMs(ms, rule.weekStart) : ms
    const periodIndex = Math.round((periodStart - periodZeroMs) / periodMs)
    if (periodIndex % rule.interval === 0) dates.push(wallDateOf(ms))
  }
  return dates
}

interface OccurrenceWindow {
  dtstartMs: number
  firstMs: number
  lastMs: number
  untilMs: number | null
}

function occurrenceWindow(startDate: LocalDate, untilDate: LocalDate | null, fromDate: LocalDate, toDate: LocalDate): OccurrenceWindow {
  const dtstartMs = wallMidnightMs(startDate)
  const untilMs = untilDate === null ? null : wallMidnightMs(untilDate)
  return {
    dtstartMs,
    untilMs,
    firstMs: Math.max(wallMidnightMs(fromDate), dtstartMs),
    lastMs: Math.min(wallMidnightMs(toDate), untilMs ?? Infinity),
  }
}

/**
 * Local dates on which a rule occurs, between `fromDate` and `toDate` (both inclusive).
 * `startDate` is DTSTART (counting for COUNT starts there) and `untilDate` the last allowed
 * date (inclusive). A start date that does not match the rule is not itself an occurrence.
 */
export function occurrenceDates(
  rrule: string,
  startDate: LocalDate,
  untilDate: LocalDate | null,
  fromDate: LocalDate,
  toDate: LocalDate,
): LocalDate[] {
  const parsed = parseValidRule(rrule)
  if (!parsed.simple) return occurrenceDatesViaRRule(rrule, startDate, untilDate, fromDate, toDate)
  const window = occurrenceWindow(startDate, untilDate, fromDate, toDate)
  if (window.firstMs > window.lastMs) return []
  return simpleOccurrences(parsed.simple, window.dtstartMs, window.firstMs, window.lastMs)
}

/** The same as `occurrenceDates`, always through rrule's general iterator (any supported rule). */
export function occurrenceDatesViaRRule(
  rrule: string,
  startDate: LocalDate,
  untilDate: LocalDate | null,
  fromDate: LocalDate,
  toDate: LocalDate,
): LocalDate[] {
  const parsed = parseValidRule(rrule)
  const window = occurrenceWindow(startDate, untilDate, fromDate, toDate)
  if (window.firstMs > window.lastMs) return []
  // noCache: a rule object lives for one call; rrule's own result cache would only hold memory.
  const rule = new RRule(
    {
      ...parsed.options,
      dtstart: new Date(window.dtstartMs),
      until: window.untilMs === null ? null : new Date(window.untilMs),
    },
    true,
  )
  return rule.between(new Date(window.firstMs), new Date(window.lastMs), true).map((d) => wallDateOf(d.getTime()))
}

// ---------------------------------------------------------------------------
// Building and describing rules for the UI, so nobody types RRULE.
// ---------------------------------------------------------------------------

const WEEKDAY_NAMES: Record<WeekdayCode, string> = {
  MO: 'Monday',
  TU: 'Tuesday',
  WE: 'Wednesday',
  TH: 'Thursday',
  FR: 'Friday',
  SA: 'Saturday',
  SU: 'Sunday',
}

function weekdayCode(weekday: IsoWeekday): WeekdayCode {
  const code = WEEKDAY_CODES[weekday - 1]
  if (!code) throw new RangeError(`Weekday ${String(weekday)} is not an ISO weekday (1–7)`)
  return code
}

function intervalPart(interval: number): string {
  if (!Number.isInteger(interval) || interval < 1) throw new RangeError(`Interval ${interval} must be a whole number above zero`)
  return interval === 1 ? '' : `;INTERVAL=${interval}`
}

/** 'FREQ=WEEKLY;BYDAY=MO,WE' (+ ';INTERVAL=n' when not every week). Weekdays are ISO 1–7. */
export function buildWeeklyRule(options: { weekdays: readonly IsoWeekday[]; interval?: number }): string {
  const unique = [...new Set(options.weekdays)].sort((a, b) => a - b)
  if (unique.length === 0) throw new RangeError('Choose at least one weekday')
  return `FREQ=WEEKLY${intervalPart(options.interval ?? 1)};BYDAY=${unique.map(weekdayCode).join(',')}`
}

/** 'FREQ=MONTHLY;BYDAY=1MO': the nth (1–5, or −1 last … −5) weekday of each month. */
export function buildMonthlyNthWeekdayRule(options: { nth: number; weekday: IsoWeekday; interval?: number }): string {
  const { nth } = options
  if (!Number.isInteger(nth) || nth === 0 || nth < -5 || nth > 5) throw new RangeError(`nth ${nth} must be 1–5 or −1 to −5`)
  return `FREQ=MONTHLY${intervalPart(options.interval ?? 1)};BYDAY=${nth}${weekdayCode(options.weekday)}`
}

const ORDINAL_WORDS: Record<string, string> = {
  '1': 'first',
  '2': 'second',
  '3': 'third',
  '4': 'fourth',
  '5': 'fifth',
  '-1': 'last',
  '-2': 'second to last',
  '-3': 'third to last',
  '-4': 'fourth to last',
  '-5': 'fifth to last',
}

function joinWithAnd(words: readonly string[]): string {
  if (words.length <= 1) return words.join('')
  return `${words.slice(0, -1).join(', ')} and ${words[words.length - 1]}`
}

/** 'every', 'every other', 'every 3 weeks on' style lead-ins. */
function everyPhrase(interval: number, unitPlural: string): string {
  if (interval === 1) return 'every'
  if (interval === 2) return 'every other'
  return `every ${interval} ${unitPlural} on`
}

function dayOfMonthWord(value: string): string {
  const n = Number(value)
  if (n === -1) return 'last day'
  if (n < 0) return `${ORDINAL_WORDS[String(n)] ?? `${-n}th to last`} day`
  const lastTwo = n % 100
  const suffix = lastTwo >= 11 && lastTwo <= 13 ? 'th' : ({ 1: 'st', 2: 'nd', 3: 'rd' } as Record<number, string>)[n % 10] ?? 'th'
  return `${n}${suffix}`
}

function monthSpan(interval: number): string {
  if (interval === 1) return 'each month'
  if (interval === 2) return 'every other month'
  return `every ${interval} months`
}

function describeWeekly(days: WeekdayCode[], interval: number): string {
  if (days.length === 0) return interval === 1 ? 'every week' : interval === 2 ? 'every other week' : `every ${interval} weeks`
  const isWorkweek = days.length === 5 && ['MO', 'TU', 'WE', 'TH', 'FR'].every((d) => days.includes(d as WeekdayCode))
  const list = isWorkweek ? 'weekday' : joinWithAnd(days.map((d) => WEEKDAY_NAMES[d]))
  return `${everyPhrase(interval, 'weeks')} ${list}`
}

function describeMonthly(parts: Map<string, string>, interval: number): string | null {
  const byday = parts.get('BYDAY')
  const bymonthday = parts.get('BYMONTHDAY')
  if (byday && !bymonthday) {
    const tokens = byday.split(',').map((t) => BYDAY_PATTERN.exec(t))
    const weekdays = new Set(tokens.map((m) => m?.[2]))
    const nths = tokens.map((m) => m?.[1])
    // Only "the first and third Monday" shapes read well; the rest falls back.
    if (weekdays.size !== 1 || nths.some((n) => n === undefined || !ORDINAL_WORDS[String(Number(n))])) return null
    const weekday = WEEKDAY_NAMES[[...weekdays][0] as WeekdayCode]
    const ordinals = joinWithAnd(nths.map((n) => ORDINAL_WORDS[String(Number(n))] ?? ''))
    return `the ${ordinals} ${weekday} of ${monthSpan(interval)}`
  }
  if (bymonthday && !byday) {
    return `the ${joinWithAnd(bymonthday.split(',').map(dayOfMonthWord))} of ${monthSpan(interval)}`
  }
  if (!byday && !bymonthday) return interval === 1 ? 'every month' : monthSpan(interval)
  return null
}

/** "the third Tuesday, Wednesday or Thursday of each month", "the last weekday of each month". */
function describeMonthlyPosition(parts: Map<string, string>, interval: number): string | null {
  const position = ORDINAL_WORDS[parts.get('BYSETPOS') ?? '']
  const days = (parts.get('BYDAY') ?? '').split(',')
  const plain = WEEKDAY_CODES.filter((code) => days.includes(code))
  const extraParts = ['BYMONTHDAY', 'BYYEARDAY', 'BYWEEKNO', 'BYMONTH'].some((key) => parts.has(key))
  if (!position || plain.length === 0 || plain.length !== days.length || extraParts) return null
  const isWorkweek = plain.join(',') === 'MO,TU,WE,TH,FR'
  const names = plain.map((d) => WEEKDAY_NAMES[d])
  const list = isWorkweek ? 'weekday' : `${names.slice(0, -1).join(', ')}${names.length > 1 ? ' or ' : ''}${names[names.length - 1]}`
  return `the ${position} ${list} of ${monthSpan(interval)}`
}

function describeCommonShape(parts: Map<string, string>): string | null {
  if (parts.get('FREQ') === 'MONTHLY' && parts.has('BYSETPOS')) {
    return describeMonthlyPosition(parts, Number(parts.get('INTERVAL') ?? '1'))
  }
  const complex = ['BYSETPOS', 'BYYEARDAY', 'BYWEEKNO', 'BYMONTH'].some((key) => parts.has(key))
  if (complex) return null
  const interval = Number(parts.get('INTERVAL') ?? '1')
  const byday = parts.get('BYDAY')
  const plainDays = byday ? byday.split(',').filter((d): d is WeekdayCode => WEEKDAY_CODES.includes(d as WeekdayCode)) : []
  if (byday && plainDays.length !== byday.split(',').length && parts.get('FREQ') !== 'MONTHLY') return null
  const ordered = WEEKDAY_CODES.filter((code) => plainDays.includes(code))
  switch (parts.get('FREQ')) {
    case 'DAILY':
      if (parts.has('BYMONTHDAY')) return null
      if (byday) return interval === 1 ? describeWeekly(ordered, 1) : null
      return interval === 1 ? 'every day' : interval === 2 ? 'every other day' : `every ${interval} days`
    case 'WEEKLY':
      return parts.has('BYMONTHDAY') ? null : describeWeekly(ordered, interval)
    case 'MONTHLY':
      return describeMonthly(parts, interval)
    default:
      return null
  }
}

function countSuffix(parts: Map<string, string>): string {
  const count = parts.get('COUNT')
  if (count === undefined) return ''
  return count === '1' ? ', once' : `, ${count} times`
}

/** Plain English for a rule: "every Monday and Wednesday", "the first Monday of each month". */
export function describeRule(rrule: string): string {
  if (validateRule(rrule)) return 'an unreadable rule'
  const parts = ruleParts(rrule)
  const common = parts ? describeCommonShape(parts) : null
  if (common && parts) return `${common}${countSuffix(parts)}`
  // Unusual shapes: rrule's own wording ("every year in June, July for 10 times").
  return new RRule(RRule.parseString(stripRulePrefix(rrule))).toText().replace(/ for (\d+) times?$/, ', $1 times')
}
