// Dates computed from today, so the suite passes on any date (never write a fixed future date).
import { DateTime } from 'luxon'

/** ISO weekday numbers, Monday = 1 … Sunday = 7 (luxon's and ISO 8601's numbering). */
export const MONDAY = 1, TUESDAY = 2, WEDNESDAY = 3, THURSDAY = 4, FRIDAY = 5, SATURDAY = 6, SUNDAY = 7

/**
 * The local date (yyyy-MM-dd) of `weekday` in the `weeksAhead`-th calendar week after the current one,
 * in `zone`. `weekdayAhead(1, MONDAY)` is next week's Monday: never today, at least one day ahead.
 * Tests that book use weeksAhead ≥ 2, so minimum notice never matters, and a distinct week per test so
 * they never share a chair.
 */
export function weekdayAhead(weeksAhead: number, weekday: number, zone = 'UTC'): string {
  if (!Number.isInteger(weeksAhead) || weeksAhead < 1) throw new Error(`weeksAhead must be a whole number ≥ 1, got ${weeksAhead}`)
  if (!Number.isInteger(weekday) || weekday < 1 || weekday > 7) throw new Error(`weekday must be 1 (Monday) … 7 (Sunday), got ${weekday}`)
  const thisMonday = DateTime.now().setZone(zone).startOf('day').minus({ days: DateTime.now().setZone(zone).weekday - 1 })
  return thisMonday.plus({ weeks: weeksAhead, days: weekday - 1 }).toISODate()!
}

/** The local date `days` after today in `zone` (negative for the past). */
export function daysFromToday(days: number, zone = 'UTC'): string {
  return DateTime.now().setZone(zone).startOf('day').plus({ days }).toISODate()!
}

/** Today's local date in `zone`. */
export function todayIn(zone = 'UTC'): string {
  return daysFromToday(0, zone)
}
