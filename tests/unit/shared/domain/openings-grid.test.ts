// The booking grid in local wall time across daylight-saving changes. Zone rules: the IANA tz
// database (US rules: clocks go forward at 02:00 on the second Sunday of March and back at 02:00 on
// the first Sunday of November; Arizona keeps MST all year).
import { describe, expect, it } from 'vitest'
import { isInPartOfDay, localMinuteOfDay, nextGridStart } from '../../../../shared/domain/openings-grid'

const LA = 'America/Los_Angeles'
const PHOENIX = 'America/Phoenix'
const at = (iso: string) => Date.parse(iso)
const iso = (ms: number) => new Date(ms).toISOString()

describe('nextGridStart', () => {
  it('keeps a start already on the grid and rounds up to the next unit otherwise', () => {
    expect(iso(nextGridStart(at('2026-03-10T16:15:00Z'), LA, 15))).toBe('2026-03-10T16:15:00.000Z')
    expect(iso(nextGridStart(at('2026-03-10T16:16:00Z'), LA, 15))).toBe('2026-03-10T16:30:00.000Z')
    expect(iso(nextGridStart(at('2026-03-10T16:16:00Z'), LA, 5))).toBe('2026-03-10T16:20:00.000Z')
  })

  it('reads the grid on the local clock, not UTC (Phoenix is UTC−7 all year)', () => {
    // 08:10 MST is 15:10Z; with a 15-minute unit the next local quarter is 08:15 = 15:15Z.
    expect(iso(nextGridStart(at('2026-07-01T15:10:00Z'), PHOENIX, 15))).toBe('2026-07-01T15:15:00.000Z')
  })

  it('never produces a local time that does not exist when clocks go forward', () => {
    // 01:50 PST on 8 March 2026; 02:00 does not exist, the next grid start is 03:00 PDT (10:00Z).
    expect(iso(nextGridStart(at('2026-03-08T09:50:00Z'), LA, 15))).toBe('2026-03-08T10:00:00.000Z')
  })

  it('offers the repeated hour twice when clocks go back, once per offset', () => {
    // 1 November 2026: 01:00–02:00 happens at 08:00Z (PDT) and again at 09:00Z (PST).
    expect(iso(nextGridStart(at('2026-11-01T08:10:00Z'), LA, 15))).toBe('2026-11-01T08:15:00.000Z')
    expect(iso(nextGridStart(at('2026-11-01T08:50:00Z'), LA, 15))).toBe('2026-11-01T09:00:00.000Z')
    expect(localMinuteOfDay(at('2026-11-01T08:15:00Z'), LA)).toBe(localMinuteOfDay(at('2026-11-01T09:15:00Z'), LA))
  })
})

describe('localMinuteOfDay and isInPartOfDay', () => {
  it('counts minutes since local midnight', () => {
    expect(localMinuteOfDay(at('2026-03-10T15:30:00Z'), LA)).toBe(8 * 60 + 30) // 08:30 PDT
    expect(localMinuteOfDay(at('2026-01-10T07:59:00Z'), LA)).toBe(23 * 60 + 59) // 23:59 PST the day before
  })

  it('calls a start before local noon morning and from noon on afternoon', () => {
    const beforeNoon = at('2026-03-10T18:59:00Z') // 11:59 PDT
    const noon = at('2026-03-10T19:00:00Z') // 12:00 PDT
    expect(isInPartOfDay(beforeNoon, LA, 'morning')).toBe(true)
    expect(isInPartOfDay(beforeNoon, LA, 'afternoon')).toBe(false)
    expect(isInPartOfDay(noon, LA, 'morning')).toBe(false)
    expect(isInPartOfDay(noon, LA, 'afternoon')).toBe(true)
    expect(isInPartOfDay(noon, LA, 'any')).toBe(true)
  })
})
