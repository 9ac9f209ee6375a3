// Refilled time: the version that sorts later visits into chairs once, against the first, plain
// version (tests/support/balance-reference.ts), on random freed and later visits in a few chairs.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { refillFigures, type FreedVisit, type LaterVisit } from '../../../../shared/domain/balance-refill'
import { refillFiguresReference } from '../../../support/balance-reference'

const M = 60_000
const BASE = Date.UTC(2027, 2, 8, 14) // any instant

const visitArb = fc.record({ id: fc.integer({ min: 1, max: 30 }), chair: fc.integer({ min: 1, max: 3 }), at: fc.integer({ min: 0, max: 2880 }), length: fc.integer({ min: 0, max: 180 }), mark: fc.integer({ min: -2880, max: 2880 }) })
const freedArb = fc.array(visitArb, { maxLength: 15 }).map((list): FreedVisit[] => list.map((visit) => ({
  visitId: visit.id, operatoryId: visit.chair, startMs: BASE + visit.at * M, endMs: BASE + (visit.at + visit.length) * M, freedAtMs: BASE + (visit.at + visit.mark) * M,
})))
const laterArb = fc.array(visitArb, { maxLength: 40 }).map((list): LaterVisit[] => list.map((visit) => ({
  visitId: visit.id, operatoryId: visit.chair, startMs: BASE + visit.at * M, endMs: BASE + (visit.at + visit.length) * M, createdAtMs: BASE + (visit.at + visit.mark) * M,
})))

describe('refillFigures', () => {
  it('gives the same figures as the plain version it replaced', () => {
    fc.assert(fc.property(freedArb, laterArb, (freed, later) => {
      expect(refillFigures(freed, later)).toEqual(refillFiguresReference(freed, later))
    }), { numRuns: 500 })
  })
})
