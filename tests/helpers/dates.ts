// Dates computed from today, so the suite passes on any date (never write a fixed future date).
import { DateTime } from 'luxon'
import { DEMO_CLOSED_MONTH_DAYS } from '../../seeds/01-sites'

// Weeks ahead taken at the demo sites (shared chairs and providers), one file each; pick a free one:
//   1 browser/week (first opening), browser/patients (10:30)   2–6 server/booking   7 server/openings
//   8 server/visit-list   9 browser/chairboard   10 server/balance   11–12 browser/balance   13 browser/my-day
// Tests on a test-only site of their own (createAnnex, createMailAnnex) may use any week
// (server/patients and server/patient-import book only at annexes of their own).
//   (browser/board-ux and browser/keyboard book today on annexes; browser/booking-drawer 7–10 days ahead on annexes.)

/** ISO weekday numbers, Monday = 1 … Sunday = 7 (luxon's and ISO 8601's numbering). */
export const MONDAY = 1, TUESDAY = 2, WEDNESDAY = 3, THURSDAY = 4, FRIDAY = 5, SATURDAY = 6, SUNDAY = 7

/**
 * The local date (yyyy-MM-dd) of `weekday` in the `weeksAhead`-th calendar week after the current one,
 * in `zone`. `weekdayAhead(1, MONDAY)` is next week's Monday: never today, at least one day ahead.
 * Tests that book use weeksAhead ≥ 2, so minimum notice never matters, and a distinct week per test so
 * they never share a chair.
 *
 * The demo sites are closed on Christmas Day and New Year's Day (`seeds/01-sites.ts`). A date that
 * lands on one of them moves 26 weeks further, to the same weekday: tests keep to weeks 2–25, so the
 * moved date (weeks 28–51) never meets another test's week, and two moved dates never meet each other.
 */
export function weekdayAhead(weeksAhead: number, weekday: number, zone = 'UTC'): string {
  if (!Number.isInteger(weeksAhead) || weeksAhead < 1 || weeksAhead > 25) throw new Error(`weeksAhead must be a whole number from 1 to 25, got ${weeksAhead}`)
  if (!Number.isInteger(weekday) || weekday < 1 || weekday > 7) throw new Error(`weekday must be 1 (Monday) … 7 (Sunday), got ${weekday}`)
  const thisMonday = DateTime.now().setZone(zone).startOf('day').minus({ days: DateTime.now().setZone(zone).weekday - 1 })
  const date = thisMonday.plus({ weeks: weeksAhead, days: weekday - 1 })
  const closed = (DEMO_CLOSED_MONTH_DAYS as readonly string[]).includes(date.toFormat('MM-dd'))
  return (closed ? date.plus({ weeks: 26 }) : date).toISODate()!
}

/** The local date `days` after `date` (yyyy-MM-dd), for the other days of a test's week. */
export function plusDays(date: string, days: number): string {
  return DateTime.fromISO(date, { zone: 'UTC' }).plus({ days }).toISODate()!
}

/** The local date `days` after today in `zone` (negative for the past). */
export function daysFromToday(days: number, zone = 'UTC'): string {
  return DateTime.now().setZone(zone).startOf('day').plus({ days }).toISODate()!
}

/** Today's local date in `zone`. */
export function todayIn(zone = 'UTC'): string {
  return daysFromToday(0, zone)
}

/**
 * The UTC instant (ISO, as the API takes it) of local wall time `time` (HH:mm) on `weekday` of the
 * `weeksAhead`-th week after the current one, in `zone`: `weekdayAhead` with a time of day.
 */
export function atAhead(weeksAhead: number, weekday: number, time: string, zone: string): string {
  return DateTime.fromISO(`${weekdayAhead(weeksAhead, weekday, zone)}T${time}`, { zone }).toUTC().toISO({ suppressMilliseconds: true })!
}
