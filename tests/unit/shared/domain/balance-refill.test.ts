// Refilled time on Balance (issue 17 §3). Our own definitions (common practice, no source): freed time
// counts from when it was freed; a refill is a later booking in the same chair overlapping it.
// Fixed instants: pure function.
import { describe, expect, it } from 'vitest'
import { median, refillFigures, type FreedVisit, type LaterVisit } from '../../../../shared/domain/balance-refill'

const H = 3_600_000
const T0 = Date.UTC(2027, 2, 10, 9) // a 09:00 start
const freed = (visitId: number, startH: number, endH: number, freedAtH: number, operatoryId = 1): FreedVisit => ({ visitId, operatoryId, startMs: T0 + startH * H, endMs: T0 + endH * H, freedAtMs: T0 + freedAtH * H })
const later = (visitId: number, startH: number, endH: number, createdAtH: number, operatoryId = 1): LaterVisit => ({ visitId, operatoryId, startMs: T0 + startH * H, endMs: T0 + endH * H, createdAtMs: T0 + createdAtH * H })

describe('median', () => {
  it('is the middle value, or the mean of the two middle ones', () => {
    expect(median([])).toBeNull()
    expect(median([5, 1, 3])).toBe(3)
    expect(median([4, 1, 3, 10])).toBe(3.5)
  })
})

describe('refillFigures', () => {
  it('measures the share of freed time later bookings took, and the median hours until the first', () => {
    const figures = refillFigures(
      [freed(1, 0, 1, -48), freed(2, 2, 4, -10), freed(3, 5, 6, -2)],
      [
        later(10, 0, 1, -45), // refills all of visit 1, 3 hours after it was freed
        later(11, 2, 3, -4), // refills the first hour of visit 2, 6 hours after
        later(12, 2.5, 3.5, -1), // overlaps the first refill: counted once, 30 more minutes
        later(13, 5, 6, -3), // booked before visit 3 was freed: not a refill
        later(14, 5, 6, -1, 2), // another chair: not a refill
      ],
    )
    expect(figures).toEqual({
      freedVisits: 3, freedMinutes: 240, refilledVisits: 2, refilledMinutes: 150, refilledShare: 150 / 240, medianHoursToRefill: (3 + 6) / 2,
    })
  })

  it('counts only the time still ahead when it was freed, and nothing freed after the end', () => {
    // Marked did not come 20 minutes into a one-hour visit: 40 minutes freed; refilled by a 30-minute visit.
    const figures = refillFigures([freed(1, 0, 1, 1 / 3), freed(2, 2, 3, 4)], [later(5, 0.5, 1, 0.5)])
    expect(figures.freedVisits).toBe(1)
    expect(figures.freedMinutes).toBe(40)
    expect(figures.refilledMinutes).toBe(30)
    expect(figures.medianHoursToRefill).toBeCloseTo(1 / 6)
  })

  it('answers null shares when nothing was freed or refilled', () => {
    expect(refillFigures([], [later(1, 0, 1, -1)])).toEqual({ freedVisits: 0, freedMinutes: 0, refilledVisits: 0, refilledMinutes: 0, refilledShare: null, medianHoursToRefill: null })
    expect(refillFigures([freed(1, 0, 1, -5)], [])).toMatchObject({ refilledShare: 0, medianHoursToRefill: null })
  })
})
