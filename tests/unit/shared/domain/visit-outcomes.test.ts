// No-show and late-cancellation rates for Balance (issue 14). Our own definitions (common practice,
// no source): late means cancelled less than 24 hours before the start. Fixed instants: pure function.
import { describe, expect, it } from 'vitest'
import { isLateCancel, LATE_CANCEL_HOURS, outcomeRates, type VisitOutcome } from '../../../../shared/domain/visit-outcomes'

const H = 3_600_000
const NOW = Date.UTC(2027, 0, 20, 12)
const visit = (state: VisitOutcome['state'], startHoursFromNow: number, cancelledHoursBeforeStart: number | null = null): VisitOutcome => {
  const startMs = NOW + startHoursFromNow * H
  return { state, startMs, cancelledAtMs: cancelledHoursBeforeStart === null ? null : startMs - cancelledHoursBeforeStart * H }
}

describe('late cancellation', () => {
  it('is a cancellation less than 24 hours before the start, or after it', () => {
    expect(LATE_CANCEL_HOURS).toBe(24)
    expect(isLateCancel(visit('cancelled', -48, 23))).toBe(true)
    expect(isLateCancel(visit('cancelled', -48, -1))).toBe(true)
    expect(isLateCancel(visit('cancelled', -48, 24))).toBe(false)
    expect(isLateCancel(visit('cancelled', -48, 72))).toBe(false)
    expect(isLateCancel(visit('finished', -48))).toBe(false)
  })
})

describe('outcomeRates', () => {
  it('counts no-shows among the visits that were due, and late cancellations among all visits', () => {
    const rates = outcomeRates([
      visit('finished', -50), visit('finished', -30), visit('missed', -26), visit('missed', -2),
      visit('cancelled', -40, 2), visit('cancelled', -20, 48),
      // Ahead of now: not due yet, so neither a show nor a no-show.
      visit('booked', 5), visit('confirmed', 30),
    ], NOW)
    expect(rates).toEqual({ visits: 8, due: 4, missed: 2, missedRate: 0.5, cancelled: 2, lateCancelled: 1, lateCancelRate: 1 / 8 })
  })

  it('has no rates without visits', () => {
    expect(outcomeRates([], NOW)).toMatchObject({ missedRate: null, lateCancelRate: null })
    expect(outcomeRates([visit('booked', 10)], NOW)).toMatchObject({ missedRate: null, lateCancelRate: 0 })
  })
})
