// One home for local dates and times (issue 12 §3). A site's calendar date is 'YYYY-MM-DD' in its
// IANA zone; a time of day is 'HH:mm'; instants are UTC. Everything that turns one into another,
// on the server or in the browser, is here, and only here.
//
// Local dates are computed as "wall milliseconds" (wall-clock fields read as if UTC), so a
// daylight-saving change can never move a date. A local date + time becomes an instant in the site's
// zone (luxon's IANA zone data) following RFC 5545 §3.3.5:
// - a time inside a spring-forward gap is read with the offset before the gap, which moves it
//   forward by the gap's length (02:30 on 8 March 2026 in Los Angeles → 03:30 PDT);
// - a time that happens twice at fall-back is the first occurrence, i.e. the earlier
//   instant with the daylight offset (01:30 on 1 November 2026 in Los Angeles → 01:30 PDT).
//   Luxon on its own picks the later one, so we resolve both cases ourselves.
import { DateTime, IANAZone } from 'luxon'
import type { IsoWeekday, LocalDate, LocalTime } from '../types/rota'

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

/** The same day `months` later (or earlier), kept inside shorter months: Aug 31 + 6 months is Feb 28 (or 29). */
export function addMonths(date: LocalDate, months: number): LocalDate {
  const [year, month, day] = date.split('-').map(Number) as [number, number, number]
  const index = year * 12 + (month - 1) + months
  const targetYear = Math.floor(index / 12)
  const targetMonth = index - targetYear * 12
  const lastDay = new Date(Date.UTC(targetYear, targetMonth + 1, 0)).getUTCDate()
  return `${String(targetYear).padStart(4, '0')}-${pad2(targetMonth + 1)}-${pad2(Math.min(day, lastDay))}`
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

/** Minutes after local midnight for 'HH:mm' ('24:00' allowed), or null for anything else (for checks on typed input). */
export function minutesOfDayOrNull(time: string): number | null {
  const match = LOCAL_TIME_PATTERN.exec(time)
  const hours = Number(match?.[1])
  const minutes = Number(match?.[2])
  const valid = match !== null && minutes < 60 && (hours < 24 || (hours === 24 && minutes === 0))
  return valid ? hours * 60 + minutes : null
}

function parseMinutesOfDay(time: LocalTime): number {
  const minutes = minutesOfDayOrNull(time)
  if (minutes === null) throw new RangeError(`Local time "${time}" is not HH:mm`)
  return minutes
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

/**
 * The first instant in (loMs, hiMs] whose offset differs from the offset at loMs, to the
 * millisecond (offset changes fall on whole minutes, so it is one). hiMs's offset must differ.
 */
function firstOffsetChangeBy(offsetAt: (utcMs: number) => number, loMs: number, hiMs: number): number {
  const before = offsetAt(loMs)
  let lo = loMs
  let hi = hiMs
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2)
    if (offsetAt(mid) === before) lo = mid
    else hi = mid
  }
  return hi
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
      const atMs = firstOffsetChangeBy((utcMs) => iana.offset(utcMs), previousMs, sampleMs)
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

/** Whether `zone` names a zone of the IANA database, such as 'America/Denver'. */
export function isKnownZone(zone: string): boolean {
  return IANAZone.isValidZone(zone)
}

/** The first instant in (loMs, hiMs] at which `zone`'s offset differs from its offset at loMs. */
export function firstOffsetChange(zone: string, loMs: number, hiMs: number): number {
  return firstOffsetChangeBy((utcMs) => offsetMinutesAt(zone, utcMs), loMs, hiMs)
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

/** Wall milliseconds (the zone's wall-clock fields read as if UTC) at a UTC instant. */
export function wallMsAt(utcMs: number, zone: string): number {
  return utcMs + offsetMinutesAt(zone, utcMs) * MINUTE_MS
}

/** The local date in `zone` at a UTC instant. */
export function localDateAt(utcMs: number, zone: string): LocalDate {
  return wallDateOf(wallMsAt(utcMs, zone))
}

/** Whole minutes after local midnight on the wall clock of `zone` at a UTC instant (0–1439). */
export function localMinutesAt(utcMs: number, zone: string): number {
  const wallMs = wallMsAt(utcMs, zone)
  return Math.floor((wallMs - wallMidnightMs(wallDateOf(wallMs))) / MINUTE_MS)
}

/**
 * The UTC ISO instant of a typed local date ('YYYY-MM-DD') and time ('HH:mm') in `zone`, or null when
 * either is not a real date or time (a form's half-filled fields).
 */
export function localToUtcOrNull(date: string, time: string, zone: string): string | null {
  if (!LOCAL_DATE_PATTERN.test(date) || minutesOfDayOrNull(time) === null || time === '24:00') return null
  try {
    return localToUtc(date, time, zone)
  } catch {
    return null
  }
}

/** Today's date on the wall clock of `zone` (a site's, never the browser's own). */
export function todayIn(zone: string, nowMs = Date.now()): LocalDate {
  return localDateAt(nowMs, zone)
}

/** The Monday of the ISO week holding `date`. */
export function mondayOf(date: LocalDate): LocalDate {
  return addDays(date, 1 - isoWeekdayOf(date))
}

/** A UTC range [fromUtc, toUtc) of ISO instants, as GET /api/visits takes it. */
export interface UtcRange {
  fromUtc: string
  toUtc: string
}

/** One local date of a zone as a UTC range (23 or 25 hours on daylight-saving days). */
export function localDayRange(date: LocalDate, zone: string): UtcRange {
  return { fromUtc: localToUtc(date, '00:00', zone), toUtc: localToUtc(addDays(date, 1), '00:00', zone) }
}

/** Local dates from..to (inclusive) in every zone at once: a UTC range wide enough for each of them. */
export function anyZoneRange(fromDate: LocalDate, toDate: LocalDate): UtcRange {
  return { fromUtc: new Date(wallMidnightMs(addDays(fromDate, -1))).toISOString(), toUtc: new Date(wallMidnightMs(addDays(toDate, 2))).toISOString() }
}

/** Minutes since local midnight of `date` (may be negative or past 1440 for visits across midnight). */
export function minutesIntoDay(utc: string, zone: string, date: LocalDate): number {
  return Math.round((Date.parse(utc) - localToUtcMs(date, '00:00', zone)) / MINUTE_MS)
}

/** 'HH:mm' on the wall clock of `zone` at a UTC instant. */
export function localTime(utc: string, zone: string): LocalTime {
  return DateTime.fromISO(utc, { zone: 'UTC' }).setZone(zone).toFormat('HH:mm')
}

/** ISO 8601 with the zone's offset (`2026-03-09T08:00:00-07:00`) at a UTC instant: a `…LocalIso` value. */
export function localIsoAt(utcMs: number, zone: string): string {
  return DateTime.fromMillis(utcMs, { zone }).toISO({ suppressMilliseconds: true }) ?? ''
}
