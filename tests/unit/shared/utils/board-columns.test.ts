import { describe, expect, it } from 'vitest'
import { fromColumnTime, toColumnTime } from '../../../../shared/utils/board-columns'

// Fixed dates on purpose: the layout functions are pure and never read the clock.
describe('Chairboard column layout', () => {
  it('draws an instant at its site-local wall time in its column and reads it back', () => {
    // 17:00Z is 09:00 in Los Angeles in winter (PST, UTC−8; IANA tz database).
    expect(toColumnTime('2027-01-11T17:00:00Z', 'America/Los_Angeles', '2027-01-11', 2)).toBe('2027-01-13T09:00:00')
    const back = fromColumnTime(new Date('2027-01-13T09:00:00Z'), 'America/Los_Angeles', '2027-01-11')
    expect(back).toEqual({ columnIndex: 2, startUtc: '2027-01-11T17:00:00Z' })
  })

  it('keeps wall time across daylight saving (8 March 2026 in Denver; IANA tz database)', () => {
    expect(toColumnTime('2026-03-09T14:00:00Z', 'America/Denver', '2026-03-09', 0)).toBe('2026-03-09T08:00:00')
    expect(toColumnTime('2026-03-06T15:00:00Z', 'America/Denver', '2026-03-06', 0)).toBe('2026-03-06T08:00:00')
    expect(fromColumnTime(new Date('2026-03-09T08:00:00Z'), 'America/Denver', '2026-03-09').startUtc).toBe('2026-03-09T14:00:00Z')
  })
})
