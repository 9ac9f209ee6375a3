// Late (shared/domain/late.ts): booked or confirmed and not arrived N minutes after the start.
// Fixed dates: the rule is handed "now".
import { describe, expect, it } from 'vitest'
import { isLate, lateText } from '../../../../shared/domain/late'

const start = '2026-12-07T17:00:00Z'
const after = (minutes: number) => Date.parse(start) + minutes * 60_000

describe('late', () => {
  it('marks a booked or confirmed visit from N minutes after its start', () => {
    expect(isLate({ state: 'booked', startUtc: start }, 10, after(9))).toBe(false)
    expect(isLate({ state: 'booked', startUtc: start }, 10, after(10))).toBe(true)
    expect(isLate({ state: 'confirmed', startUtc: start }, 10, after(45))).toBe(true)
  })
  it('follows the site\'s minutes, 0 meaning at the start', () => {
    expect(isLate({ state: 'booked', startUtc: start }, 0, after(0))).toBe(true)
    expect(isLate({ state: 'booked', startUtc: start }, 30, after(29))).toBe(false)
  })
  it('never marks a visit whose patient arrived, or a closed one', () => {
    for (const state of ['arrived', 'treating', 'finished', 'missed', 'cancelled'] as const) {
      expect(isLate({ state, startUtc: start }, 10, after(60))).toBe(false)
    }
  })
  it('says how late in whole minutes', () => {
    expect(lateText(start, after(14.9))).toBe('late 14 min')
  })
})
