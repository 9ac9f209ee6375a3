import { describe, expect, it } from 'vitest'
import { describeRule } from '../../../../shared/domain/recurrence/describe'
import { occurrenceDates } from '../../../../shared/domain/recurrence/occurrences'
import { choiceFromRule, ruleFromChoice } from '../../../../shared/domain/rule-choice'
import { rotaEntries } from '../../../../shared/domain/rota-week'

describe('rule choices of the Rota form', () => {
  it('builds the three shapes the brief names, in words', () => {
    const mondayWednesday = ruleFromChoice({ mode: 'weekly', weekdays: [3, 1], interval: 1 })!
    const otherFriday = ruleFromChoice({ mode: 'weekly', weekdays: [5], interval: 2 })!
    const firstMonday = ruleFromChoice({ mode: 'monthly', nth: 1, weekday: 1 })!
    expect([mondayWednesday, otherFriday, firstMonday]).toEqual(['FREQ=WEEKLY;BYDAY=MO,WE', 'FREQ=WEEKLY;INTERVAL=2;BYDAY=FR', 'FREQ=MONTHLY;BYDAY=1MO'])
    expect([mondayWednesday, otherFriday, firstMonday].map(describeRule)).toEqual(['every Monday and Wednesday', 'every other Friday', 'the first Monday of each month'])
  })

  it('counts every other Friday from the week of the first day (RFC 5545 §3.3.10, WKST=MO)', () => {
    const rule = ruleFromChoice({ mode: 'weekly', weekdays: [5], interval: 2 })!
    expect(occurrenceDates(rule, '2026-03-02', null, '2026-03-01', '2026-04-05')).toEqual(['2026-03-06', '2026-03-20', '2026-04-03'])
  })

  it('reads simple rules back into choices and keeps anything else as custom', () => {
    expect(choiceFromRule('FREQ=WEEKLY;BYDAY=TU,TH')).toEqual({ mode: 'weekly', weekdays: [2, 4], interval: 1 })
    expect(choiceFromRule('FREQ=WEEKLY;INTERVAL=2;BYDAY=FR')).toEqual({ mode: 'weekly', weekdays: [5], interval: 2 })
    expect(choiceFromRule('FREQ=MONTHLY;BYDAY=-1FR')).toEqual({ mode: 'monthly', nth: -1, weekday: 5 })
    expect(choiceFromRule('FREQ=MONTHLY;BYMONTHDAY=1,15')).toEqual({ mode: 'custom', rrule: 'FREQ=MONTHLY;BYMONTHDAY=1,15' })
    expect(choiceFromRule('FREQ=WEEKLY;BYDAY=MO;COUNT=4').mode).toBe('custom')
  })

  it('refuses an incomplete weekly choice and a broken custom rule', () => {
    expect(ruleFromChoice({ mode: 'weekly', weekdays: [], interval: 1 })).toBeNull()
    expect(ruleFromChoice({ mode: 'custom', rrule: 'FREQ=SOMETIMES' })).toBeNull()
  })
})

describe('rota week entries', () => {
  const site = { id: 1, timeZone: 'America/Denver', openingHours: { '1': [], '2': [], '3': [], '4': [], '5': [], '6': [{ start: '09:00', end: '12:00' }], '7': [] }, closedDates: ['2026-03-12'] }

  it('lists shift occurrences with wall times and UTC, skipping closed dates', () => {
    const entries = rotaEntries({
      sites: [site],
      shifts: [{ id: 5, providerId: 9, siteId: 1, rrule: 'FREQ=WEEKLY;BYDAY=TU,TH', startDate: '2026-03-02', untilDate: null, localStart: '07:30', localEnd: '16:00' }],
      exceptions: [{ id: 6, providerId: 9, kind: 'extra', siteId: 1, startDate: '2026-03-14', endDate: '2026-03-14', localStart: null, localEnd: null }],
      blocks: [],
      fromDate: '2026-03-09',
      toDate: '2026-03-15',
      providerName: () => 'Dr. Vale',
    })
    // 10 March 2026 07:30 MDT (UTC−06:00, after the 8 March change; IANA tz database) is 13:30Z.
    expect(entries.map((e) => [e.kind, e.date, e.localStart, e.startUtc])).toEqual([
      ['shift', '2026-03-10', '07:30', '2026-03-10T13:30:00.000Z'],
      ['extra', '2026-03-14', '09:00', '2026-03-14T15:00:00.000Z'],
    ])
    expect(entries[0]!.label).toBe('Dr. Vale')
  })
})
