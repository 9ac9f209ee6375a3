// Building rules from the Rota form's choices, so nobody types RRULE.
import type { IsoWeekday } from '../../types/rota'
import { WEEKDAY_CODES, type WeekdayCode } from './rules'

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
