// Balance's linear siteBalance against the first, plain version (tests/support/balance-reference.ts)
// on random small sites: overlapping and unsorted segments, segments without a provider, days that
// are 23, 24 or 25 hours long, days with nobody on shift, a range that cuts into the first and last day.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { siteBalance, type BalanceInput, type BalanceSegment } from '../../../../shared/domain/balance'
import type { StepKind } from '../../../../shared/types/chair-time'
import { siteBalanceReference } from '../../../support/balance-reference'

const M = 60_000
const BASE = Date.UTC(2027, 2, 8, 6) // any instant: the figures work on plain instants
const KINDS: StepKind[] = ['hands_on', 'assist', 'numbing', 'reset']

const spanArb = fc.record({ at: fc.integer({ min: -120, max: 4 * 1440 }), length: fc.integer({ min: 0, max: 600 }) })
  .map(({ at, length }) => ({ startMs: BASE + at * M, endMs: BASE + (at + length) * M }))

const inputArb: fc.Arbitrary<BalanceInput> = fc.record({
  chairs: fc.integer({ min: 1, max: 4 }),
  providers: fc.uniqueArray(fc.integer({ min: 1, max: 5 }), { maxLength: 3 }),
  open: fc.array(fc.array(spanArb, { maxLength: 6 }), { minLength: 4, maxLength: 4 }),
  shifts: fc.array(fc.array(spanArb, { maxLength: 5 }), { minLength: 5, maxLength: 5 }),
  segments: fc.array(fc.record({ span: spanArb, chair: fc.integer({ min: 1, max: 5 }), provider: fc.option(fc.integer({ min: 1, max: 5 })), kind: fc.constantFrom(...KINDS) }), { maxLength: 60 }),
  dayHours: fc.array(fc.constantFrom(23, 24, 24, 24, 25), { minLength: 1, maxLength: 4 }),
  cutStart: fc.integer({ min: 0, max: 300 }),
  cutEnd: fc.integer({ min: 0, max: 300 }),
  withDays: fc.boolean(),
}).map(({ chairs, providers, open, shifts, segments, dayHours, cutStart, cutEnd, withDays }) => {
  let cursor = BASE
  const days = dayHours.map((hours, index) => {
    const day = { date: `2027-03-${String(8 + index).padStart(2, '0')}`, startMs: cursor, endMs: cursor + hours * 60 * M }
    cursor = day.endMs
    return day
  })
  const segmentList: BalanceSegment[] = segments.map(({ span, chair, provider, kind }) => ({ ...span, operatoryId: chair, providerId: provider, kind }))
  return {
    fromMs: BASE + cutStart * M, toMs: cursor - cutEnd * M,
    operatories: Array.from({ length: chairs }, (_, index) => ({ operatoryId: index + 1, intervals: open[index]! })),
    providers: providers.map((providerId) => ({ providerId, intervals: shifts[providerId - 1]! })),
    segments: segmentList,
    ...(withDays ? { days } : {}),
  }
})

describe('siteBalance', () => {
  it('gives the same figures as the plain version it replaced', () => {
    fc.assert(fc.property(inputArb, fc.constantFrom({ quietBelow: 0.5, tightFrom: 0.9 }, { quietBelow: 0.2, tightFrom: 0.6 }), (input, thresholds) => {
      expect(siteBalance(input, thresholds)).toEqual(siteBalanceReference(input, thresholds))
    }), { numRuns: 400 })
  })
})
