// Recall due dates (issue 17 §1). Intervals are the site's; 6 months for a cleaning and 12 for an exam
// are common practice defaults, no source (the treating clinician sets each patient's interval).
import { describe, expect, it } from 'vitest'
import { mayMailRecall, nextDueDate, recallKindsOf, recallMonthsFor, recallSettingsOf, recallStatus, spreadOpenings } from '../../../../shared/domain/recall'
import { addMonths } from '../../../../shared/utils/local-date'

describe('recall', () => {
  it('kinds come from template categories', () => {
    expect(recallKindsOf(['hygiene'])).toEqual(['cleaning'])
    expect(recallKindsOf(['exam', 'hygiene'])).toEqual(['cleaning', 'exam'])
    expect(recallKindsOf(['restorative'])).toEqual([])
  })
  it('next due date: the site interval after the visit, kept inside short months', () => {
    const settings = recallSettingsOf({})
    expect(nextDueDate('2027-01-11', 'cleaning', settings)).toBe('2027-07-11')
    expect(nextDueDate('2027-01-11', 'exam', settings)).toBe('2028-01-11')
    expect(nextDueDate('2027-08-31', 'cleaning', recallSettingsOf({ recallMonths: { cleaning: 6 } }))).toBe('2028-02-29')
    expect(nextDueDate('2027-01-11', 'cleaning', recallSettingsOf({ recallMonths: { cleaning: 4 } }))).toBe('2027-05-11')
    expect(addMonths('2027-11-30', 3)).toBe('2028-02-29')
    expect(addMonths('2027-03-31', -1)).toBe('2027-02-28')
  })
  it('a patient\'s own interval wins over the site\'s for that kind only (common practice, no source)', () => {
    const settings = recallSettingsOf({ recallMonths: { cleaning: 6, exam: 12 } })
    expect(nextDueDate('2027-01-11', 'cleaning', settings, { cleaning: 3 })).toBe('2027-04-11')
    expect(nextDueDate('2027-01-11', 'exam', settings, { cleaning: 3 })).toBe('2028-01-11')
    expect(recallMonthsFor('exam', settings, { exam: 24 })).toBe(24)
    // Out of bounds or not whole: the site's interval applies.
    expect(recallMonthsFor('cleaning', settings, { cleaning: 0 })).toBe(6)
    expect(recallMonthsFor('cleaning', settings, { cleaning: 37 })).toBe(6)
    expect(recallMonthsFor('cleaning', settings, { cleaning: 2.5 })).toBe(6)
  })
  it('a patient is not mailed again within the minimum interval', () => {
    const settings = recallSettingsOf({ recallMailMinDays: 14 })
    expect(mayMailRecall(null, 0, settings)).toBe(true)
    expect(mayMailRecall(0, 13 * 86_400_000, settings)).toBe(false)
    expect(mayMailRecall(0, 14 * 86_400_000, settings)).toBe(true)
  })
  it('overdue, due soon or later', () => {
    expect(recallStatus('2027-01-10', '2027-01-11')).toBe('overdue')
    expect(recallStatus('2027-02-10', '2027-01-11')).toBe('due')
    expect(recallStatus('2027-03-11', '2027-01-11')).toBe('later')
  })
  it('the recall page\'s times: earliest first, a couple of hours apart, at most the count (common practice, no source)', () => {
    const at = (minutes: number) => ({ startUtc: new Date(Date.UTC(2027, 0, 11, 8) + minutes * 60_000).toISOString() })
    const every5 = Array.from({ length: 200 }, (_, index) => at(index * 5)).reverse()
    expect(spreadOpenings(every5, 6, 120)).toEqual([at(0), at(120), at(240), at(360), at(480), at(600)])
    expect(spreadOpenings([at(0), at(30), at(150)], 6, 120)).toEqual([at(0), at(150)])
    expect(spreadOpenings([], 6, 120)).toEqual([])
  })
})
