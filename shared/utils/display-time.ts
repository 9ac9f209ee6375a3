// The one formatter for times and dates people read (issue 14): every screen, e-mail, print and the
// Outbox show instants through these functions with the site's `DisplayStyle` (its zone, its clock
// '12h' | '24h' and its date order). Pure: luxon and Intl only, English (en-US) words. Calendar
// arithmetic stays in local-date.ts; this file only turns values into words and back.
//
// Lengths of a date:
//   numeric  09/13/1973 · 13/09/1973 · 1973-09-13          (inputs, tables, patient birth dates)
//   medium   Dec 1, 2026 · 1 Dec 2026 · 2026-12-01         (lists with a year)
//   short    Tue, Dec 1 · Tue 1 Dec · Tue 2026-12-01        (boards, panels, subjects)
//   long     Tuesday, December 1, 2026 · Tuesday 1 December 2026 · Tuesday 2026-12-01 (headings, e-mails)
import { DateTime } from 'luxon'
import type { LocalDate, LocalTime } from '../types/rota'
import type { ClockStyle, DateOrder, DisplayStyle } from '../types/display'
import { addDays, localDateAt } from './local-date'

export type DateLength = 'numeric' | 'medium' | 'short' | 'long'
type Instant = string | number | Date

/** What a site shows when it has chosen nothing: a US practice's habits. */
export const DEFAULT_DISPLAY: Omit<DisplayStyle, 'timeZone'> = { clock: '12h', dateOrder: 'month-day-year' }

const LOCAL_DATE = /^\d{4}-\d{2}-\d{2}$/

/** A site's display style from its row or summary; no site (or none found) reads with the defaults in `zone`. */
export function displayStyleOf(site: DisplayStyle | null | undefined, zone = 'UTC'): DisplayStyle {
  return site ? { timeZone: site.timeZone, clock: site.clock, dateOrder: site.dateOrder } : { timeZone: zone, ...DEFAULT_DISPLAY }
}

function msOf(instant: Instant): number {
  if (typeof instant === 'number') return instant
  if (instant instanceof Date) return instant.getTime()
  return Date.parse(instant)
}

function wallDate(date: LocalDate): DateTime {
  return DateTime.fromISO(date, { zone: 'UTC' }).setLocale('en-US')
}

const DATE_PATTERNS: Record<DateOrder, Record<DateLength, string>> = {
  'month-day-year': { numeric: 'MM/dd/yyyy', medium: 'LLL d, yyyy', short: 'ccc, LLL d', long: 'cccc, LLLL d, yyyy' },
  'day-month-year': { numeric: 'dd/MM/yyyy', medium: 'd LLL yyyy', short: 'ccc d LLL', long: 'cccc d LLLL yyyy' },
  'year-month-day': { numeric: 'yyyy-MM-dd', medium: 'yyyy-MM-dd', short: 'ccc yyyy-MM-dd', long: 'cccc yyyy-MM-dd' },
}

const TIME_PATTERNS: Record<ClockStyle, string> = { '12h': 'h:mm a', '24h': 'HH:mm' }

/** A local calendar date ('YYYY-MM-DD') in the site's date order. */
export function formatLocalDate(date: LocalDate, style: Pick<DisplayStyle, 'dateOrder'>, length: DateLength = 'short'): string {
  return wallDate(date).toFormat(DATE_PATTERNS[style.dateOrder][length])
}

/** A wall-clock time ('HH:mm', '24:00' allowed as an end) on the site's clock: '9:05 AM' or '09:05'. */
export function formatWallTime(time: LocalTime, style: Pick<DisplayStyle, 'clock'>): string {
  if (style.clock === '24h') return time
  const [hours, minutes] = time.split(':').map(Number) as [number, number]
  const hour12 = hours % 12 === 0 ? 12 : hours % 12
  return `${hour12}:${String(minutes).padStart(2, '0')} ${hours % 24 < 12 ? 'AM' : 'PM'}`
}

/** An hour line on a day axis: '7 AM' or '07:00'. */
export function formatHour(hour: number, style: Pick<DisplayStyle, 'clock'>): string {
  if (style.clock === '24h') return `${String(hour).padStart(2, '0')}:00`
  return `${hour % 12 === 0 ? 12 : hour % 12} ${hour % 24 < 12 ? 'AM' : 'PM'}`
}

const WEEK_START_PATTERNS: Record<DateOrder, string> = { 'month-day-year': 'LLL d', 'day-month-year': 'd LLL', 'year-month-day': 'yyyy-MM-dd' }

/** The seven local dates of the week starting `monday`, labelled short in the site's date order ('Mon, Mar 9' / 'Mon 9 Mar'), with today marked. */
export function weekDays(monday: LocalDate, style: Pick<DisplayStyle, 'dateOrder'>, today: LocalDate | null = null): { date: LocalDate; label: string; today: boolean }[] {
  return Array.from({ length: 7 }, (_, index) => {
    const date = addDays(monday, index)
    return { date, label: formatLocalDate(date, style, 'short'), today: date === today }
  })
}

/** The week starting `monday` as a toolbar names it: 'Mar 9 – Mar 15, 2026', '9 Mar – 15 Mar 2026' or '2026-03-09 – 2026-03-15'. */
export function weekLabelOf(monday: LocalDate, style: Pick<DisplayStyle, 'dateOrder'>): string {
  return `${wallDate(monday).toFormat(WEEK_START_PATTERNS[style.dateOrder])} – ${formatLocalDate(addDays(monday, 6), style, 'medium')}`
}

/** The time of an instant on the site's wall clock. */
export function formatTime(instant: Instant, style: DisplayStyle): string {
  return DateTime.fromMillis(msOf(instant), { zone: style.timeZone }).setLocale('en-US').toFormat(TIME_PATTERNS[style.clock])
}

/** The site-local date of an instant. */
export function formatDate(instant: Instant, style: DisplayStyle, length: DateLength = 'short'): string {
  return formatLocalDate(localDateAt(msOf(instant), style.timeZone), style, length)
}

/** Date and time of an instant: 'Tue, Dec 1, 9:00 AM'; the long form reads 'Tuesday, December 1, 2026 at 9:00 AM'. */
export function formatDateTime(instant: Instant, style: DisplayStyle, length: DateLength = 'short'): string {
  return `${formatDate(instant, style, length)}${length === 'long' ? ' at' : ','} ${formatTime(instant, style)}`
}

/** Two times of one visit or shift: '9:00 AM–10:30 AM' or '09:00–10:30'. */
export function formatTimeRange(start: Instant, end: Instant, style: DisplayStyle): string {
  return `${formatTime(start, style)}–${formatTime(end, style)}`
}

/** A range with its date: 'Tue, Dec 1, 9:00 AM–10:30 AM'; a range across midnight names both dates. */
export function formatRange(start: Instant, end: Instant, style: DisplayStyle, length: DateLength = 'short'): string {
  const sameDay = localDateAt(msOf(start), style.timeZone) === localDateAt(msOf(end) - 1, style.timeZone)
  return sameDay
    ? `${formatDate(start, style, length)}, ${formatTimeRange(start, end, style)}`
    : `${formatDateTime(start, style, length)} – ${formatDateTime(end, style, length)}`
}

/** How a date field asks for its value: 'MM/DD/YYYY', 'DD/MM/YYYY' or 'YYYY-MM-DD'. */
/** The date orders as a choice list names them, with an example date. */
export const DATE_ORDER_LABELS: Record<DateOrder, string> = {
  'month-day-year': 'month/day/year (07/09/1984)',
  'day-month-year': 'day/month/year (09/07/1984)',
  'year-month-day': 'year-month-day (1984-07-09)',
}

export function dateInputHint(order: DateOrder): string {
  return { 'month-day-year': 'MM/DD/YYYY', 'day-month-year': 'DD/MM/YYYY', 'year-month-day': 'YYYY-MM-DD' }[order]
}

/**
 * A typed date in the site's order (separators '/', '.' or '-', one- or two-digit day and month,
 * four-digit year) or ISO 'YYYY-MM-DD', as a local date; null when it is not a real date.
 */
export function parseDateInput(text: string, order: DateOrder): LocalDate | null {
  const value = text.trim()
  if (value.length > 10) return null
  let year: string, month: string, day: string
  if (LOCAL_DATE.test(value)) [year, month, day] = value.split('-') as [string, string, string]
  else {
    const parts = /^(\d{1,4})[/.-](\d{1,2})[/.-](\d{1,4})$/.exec(value)
    if (!parts) return null
    const [, first, second, third] = parts as unknown as [string, string, string, string]
    if (order === 'year-month-day') [year, month, day] = [first, second, third]
    else if (order === 'month-day-year') [month, day, year] = [first, second, third]
    else [day, month, year] = [first, second, third]
  }
  if (year.length !== 4 || month.length > 2 || day.length > 2) return null
  const iso = `${year}-${month.padStart(2, '0')}-${day.padStart(2, '0')}`
  return DateTime.fromISO(iso, { zone: 'UTC' }).isValid ? iso : null
}

function zoneNamePart(zone: string, atMs: number, timeZoneName: 'long' | 'longGeneric' | 'shortOffset'): string {
  const parts = new Intl.DateTimeFormat('en-US', { timeZone: zone, timeZoneName }).formatToParts(new Date(atMs))
  return parts.find((part) => part.type === 'timeZoneName')?.value ?? zone
}

/**
 * A zone as people say it, with its offset at `atMs`: 'Pacific time, UTC−8' (U+2212 minus sign),
 * 'Mountain time, UTC−7' (Phoenix too: it keeps standard time all year). A zone without a common
 * name shows its offset alone ('UTC+0').
 */
export function zoneLabel(zone: string, atMs: number = Date.now()): string {
  const name = zoneNamePart(zone, atMs, 'longGeneric').replace(/ (Standard )?Time$/, ' time')
  const offset = zoneNamePart(zone, atMs, 'shortOffset').replace(/^GMT/, 'UTC').replace('-', '\u2212')
  return name.startsWith('GMT') ? offset : `${name}, ${offset}`
}

/** The zone's name at `atMs` as a calendar writes it beside a time: 'Pacific Standard Time', 'Pacific Daylight Time'. */
export function zoneLongName(zone: string, atMs: number): string {
  return zoneNamePart(zone, atMs, 'long')
}
