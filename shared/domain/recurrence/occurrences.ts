// The local dates on which a rule occurs. Occurrences are computed in LOCAL WALL TIME: a rule's
// dates come from rrule on "floating" dates (wall-clock values in a Date's UTC fields), so a
// daylight-saving change can never move an occurrence to another day; turning a local date and
// time into an instant is shared/utils/local-date.ts's job.
import type { IsoWeekday, LocalDate } from '../../types/rota'
import { DAY_MS, wallDateOf, wallMidnightMs } from '../../utils/local-date'
import { RRule, WEEKDAY_CODES, ruleParts, stripRulePrefix, validateRule, type WeekdayCode } from './rules'

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

// Expansion reads the same few rules over and over; remember them (bounded).
const parsedRuleMemo = new Map<string, ParsedRule>()
const MEMO_LIMIT = 20_000
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
  if (parsedRuleMemo.size >= MEMO_LIMIT) parsedRuleMemo.clear()
  parsedRuleMemo.set(rrule, parsed)
  return parsed
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

/** One rule's DTSTART and UNTIL, and the wall days it may occur on within the asked dates. */
interface OccurrenceWindow {
  dtstartMs: number
  firstMs: number
  lastMs: number
  untilMs: number | null
}

/** The rule's window over fromDate..toDate, or null when the rule's dates and the asked dates do not meet. */
function occurrenceWindow(startDate: LocalDate, untilDate: LocalDate | null, fromDate: LocalDate, toDate: LocalDate): OccurrenceWindow | null {
  const dtstartMs = wallMidnightMs(startDate)
  const untilMs = untilDate === null ? null : wallMidnightMs(untilDate)
  const firstMs = Math.max(wallMidnightMs(fromDate), dtstartMs)
  const lastMs = Math.min(wallMidnightMs(toDate), untilMs ?? Infinity)
  return firstMs > lastMs ? null : { dtstartMs, untilMs, firstMs, lastMs }
}

/** rrule's general iterator over a window (any supported rule). */
function generalOccurrences(parsed: ParsedRule, window: OccurrenceWindow): LocalDate[] {
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

/**
 * Local dates on which a rule occurs, between `fromDate` and `toDate` (both inclusive).
 * `startDate` is DTSTART (counting for COUNT starts there) and `untilDate` the last allowed
 * date (inclusive). A start date that does not match the rule is not itself an occurrence.
 * Simple weekly and daily rules are counted directly; any other rule goes through rrule.
 */
export function occurrenceDates(rrule: string, startDate: LocalDate, untilDate: LocalDate | null, fromDate: LocalDate, toDate: LocalDate): LocalDate[] {
  const parsed = parseValidRule(rrule)
  const window = occurrenceWindow(startDate, untilDate, fromDate, toDate)
  if (window === null) return []
  return parsed.simple ? simpleOccurrences(parsed.simple, window.dtstartMs, window.firstMs, window.lastMs) : generalOccurrences(parsed, window)
}

/** The same as `occurrenceDates`, always through rrule's general iterator (the tests compare the two). */
export function occurrenceDatesViaRRule(rrule: string, startDate: LocalDate, untilDate: LocalDate | null, fromDate: LocalDate, toDate: LocalDate): LocalDate[] {
  const parsed = parseValidRule(rrule)
  const window = occurrenceWindow(startDate, untilDate, fromDate, toDate)
  return window === null ? [] : generalOccurrences(parsed, window)
}
