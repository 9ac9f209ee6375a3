import { describe, expect, it } from 'vitest'
import { buildMonthlyNthWeekdayRule, buildWeeklyRule } from '../../../../../shared/domain/recurrence/build'
import { occurrenceDates } from '../../../../../shared/domain/recurrence/occurrences'
import { validateRule } from '../../../../../shared/domain/recurrence/rules'

describe('rule builders', () => {
  it('builds weekly rules from ISO weekdays, sorted and without repeats', () => {
    expect(buildWeeklyRule({ weekdays: [3, 1, 3] })).toBe('FREQ=WEEKLY;BYDAY=MO,WE')
    expect(buildWeeklyRule({ weekdays: [5], interval: 2 })).toBe('FREQ=WEEKLY;INTERVAL=2;BYDAY=FR')
    expect(() => buildWeeklyRule({ weekdays: [] })).toThrow(RangeError)
    expect(() => buildWeeklyRule({ weekdays: [1], interval: 0 })).toThrow(RangeError)
  })

  it('builds monthly nth-weekday rules', () => {
    expect(buildMonthlyNthWeekdayRule({ nth: 1, weekday: 1 })).toBe('FREQ=MONTHLY;BYDAY=1MO')
    expect(buildMonthlyNthWeekdayRule({ nth: -1, weekday: 5, interval: 3 })).toBe('FREQ=MONTHLY;INTERVAL=3;BYDAY=-1FR')
    expect(() => buildMonthlyNthWeekdayRule({ nth: 0, weekday: 1 })).toThrow(RangeError)
    expect(validateRule(buildMonthlyNthWeekdayRule({ nth: 4, weekday: 7 }))).toBeNull()
  })

  it('built rules produce the expected dates', () => {
    // 2026-01: Mondays 5, 12, 19, 26 → first Monday 5 Jan; February's is the 2nd.
    expect(occurrenceDates(buildMonthlyNthWeekdayRule({ nth: 1, weekday: 1 }), '2026-01-01', null, '2026-01-01', '2026-02-28')).toEqual([
      '2026-01-05', '2026-02-02',
    ])
  })
})
