// The Openings engine against a literal minute-by-minute reference (tests/support), on random
// small calendars that cross daylight-saving changes in several zones.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { findOpenings } from '../../../../shared/domain/openings'
import { mergeIntervals } from '../../../../shared/domain/intervals'
import type { BookingUnitMinutes, OperatoryCapability, StepKind, TemplateCategory } from '../../../../shared/types/chair-time'
import type { BusySegment, OpeningsPlan, OpeningsQuery, OpeningsSite, PartOfDay } from '../../../../shared/types/openings'
import type { EpochInterval } from '../../../../shared/types/rota'
import { bruteForceOpenings, firstViolation, indexForBruteForce } from '../../../support/openings-brute-force'

const MINUTE_MS = 60_000
const ZONES = ['America/Los_Angeles', 'America/Denver', 'America/Phoenix', 'Pacific/Auckland', 'Asia/Kathmandu', 'Australia/Lord_Howe'] as const
// Range starts near daylight-saving changes (LA/Denver spring and autumn, Auckland and Lord Howe in April) and on plain days.
const RANGE_STARTS = ['2026-03-08T06:00:00Z', '2026-03-08T08:30:00Z', '2026-11-01T06:00:00Z', '2026-11-01T08:00:00Z', '2026-04-04T12:00:00Z', '2026-04-04T14:30:00Z', '2026-01-12T15:00:00Z']
const PROVIDER_POOL = [1, 2, 3]
const STEP_KINDS: StepKind[] = ['hands_on', 'assist', 'numbing', 'reset']
const CAPABILITIES: OperatoryCapability[] = ['restorative', 'hygiene']
const CATEGORIES: TemplateCategory[] = ['restorative', 'hygiene']

/** Interval lists as minute offsets from the range start, sometimes off by half a minute. */
function intervalsArb(rangeMinutes: number): fc.Arbitrary<Array<{ at: number; length: number; shift: number }>> {
  return fc.array(
    fc.record({ at: fc.integer({ min: -60, max: rangeMinutes }), length: fc.integer({ min: 20, max: 400 }), shift: fc.constantFrom(0, 0, 0, 30_000) }),
    { minLength: 1, maxLength: 4 },
  )
}

/** Mostly undefined: filters that are always on would leave most calendars empty. */
function sometimes<T>(arb: fc.Arbitrary<T>): fc.Arbitrary<T | undefined> {
  return fc.oneof({ arbitrary: fc.constant(undefined), weight: 4 }, { arbitrary: arb, weight: 1 })
}

const capabilitiesArb = fc.constantFrom<string[]>(['restorative', 'hygiene'], ['restorative', 'hygiene'], ['restorative'], ['hygiene'], [])
const categoriesArb = fc.constantFrom<string[]>(['restorative', 'hygiene'], ['restorative', 'hygiene'], ['restorative'], ['hygiene'])

function toIntervals(baseMs: number, raw: Array<{ at: number; length: number; shift: number }>): EpochInterval[] {
  return mergeIntervals(raw.map((r) => ({ startMs: baseMs + r.at * MINUTE_MS + r.shift, endMs: baseMs + (r.at + r.length) * MINUTE_MS })))
}

const planArb: fc.Arbitrary<OpeningsPlan> = fc
  .array(fc.record({ kind: fc.constantFrom(...STEP_KINDS), minutes: fc.integer({ min: 1, max: 20 }) }), { minLength: 1, maxLength: 4 })
  .map((steps) => {
    let at = 0
    const segments = steps.map((s) => {
      const segment = { kind: s.kind, startMinute: at, endMinute: at + s.minutes }
      at += s.minutes
      return segment
    })
    return { segments, chairMinutes: at }
  })

interface SiteShape {
  zone: string
  unit: BookingUnitMinutes
  operatories: Array<{ active: boolean; capabilities: string[]; open: Array<{ at: number; length: number; shift: number }> }>
  providers: Array<{ id: number; categories: string[]; shift: Array<{ at: number; length: number; shift: number }> }>
}

function siteShapeArb(rangeMinutes: number): fc.Arbitrary<SiteShape> {
  return fc.record({
    zone: fc.constantFrom(...ZONES),
    unit: fc.constantFrom<BookingUnitMinutes>(5, 10, 15),
    operatories: fc.array(
      fc.record({
        active: fc.constantFrom(true, true, true, false),
        capabilities: capabilitiesArb,
        open: intervalsArb(rangeMinutes),
      }),
      { minLength: 1, maxLength: 3 },
    ),
    providers: fc.uniqueArray(
      fc.record({ id: fc.constantFrom(...PROVIDER_POOL), categories: categoriesArb, shift: intervalsArb(rangeMinutes) }),
      { minLength: 1, maxLength: 3, selector: (p) => p.id },
    ),
  })
}

function buildSite(shape: SiteShape, siteIndex: number, baseMs: number): OpeningsSite {
  const id = siteIndex + 1
  const operatories = shape.operatories.map((o, i) => ({ id: id * 10 + i, siteId: id, active: o.active, capabilities: o.capabilities }))
  return {
    id,
    timeZone: shape.zone,
    bookingUnitMinutes: shape.unit,
    operatories,
    providers: shape.providers.map((p) => ({ id: p.id, categories: p.categories })),
    availability: {
      operatories: shape.operatories.map((o, i) => ({ operatoryId: id * 10 + i, intervals: toIntervals(baseMs, o.open) })),
      providers: shape.providers.map((p) => ({ providerId: p.id, siteId: id, intervals: toIntervals(baseMs, p.shift) })),
      blocks: [],
    },
  }
}

const busyRawArb = (rangeMinutes: number) =>
  fc.array(
    fc.record({
      operatorySlot: fc.integer({ min: 0, max: 5 }),
      providerId: fc.option(fc.constantFrom(...PROVIDER_POOL), { nil: null }),
      kind: fc.constantFrom(...STEP_KINDS),
      at: fc.integer({ min: -60, max: rangeMinutes + 60 }),
      length: fc.integer({ min: 1, max: 90 }),
    }),
    { maxLength: 8 },
  )

export const queryArb: fc.Arbitrary<OpeningsQuery> = fc
  // Up to two days, so the engine's one-day first horizon is crossed.
  .record({ rangeStart: fc.constantFrom(...RANGE_STARTS), rangeMinutes: fc.oneof(fc.integer({ min: 60, max: 540 }), fc.integer({ min: 1200, max: 2880 })) })
  .chain(({ rangeStart, rangeMinutes }) =>
    fc.record({
      baseMs: fc.constant(Date.parse(rangeStart)),
      rangeMinutes: fc.constant(rangeMinutes),
      sites: fc.array(siteShapeArb(rangeMinutes), { minLength: 1, maxLength: 2 }),
      busy: busyRawArb(rangeMinutes),
      plan: planArb,
      capability: fc.constantFrom(...CAPABILITIES),
      category: fc.constantFrom(...CATEGORIES),
      nowOffset: fc.integer({ min: -120, max: rangeMinutes }),
      notice: fc.constantFrom(0, 0, 15, 60, 90),
      providerId: sometimes(fc.constantFrom(...PROVIDER_POOL)),
      operatorySlot: sometimes(fc.integer({ min: 0, max: 5 })),
      preferredProviderId: sometimes(fc.constantFrom(...PROVIDER_POOL)),
      preferredSiteId: sometimes(fc.constantFrom(1, 2)),
      partOfDay: fc.constantFrom<PartOfDay>('any', 'any', 'morning', 'afternoon'),
      fewestGaps: fc.boolean(),
    }),
  )
  .map((raw) => {
    const sites = raw.sites.map((shape, i) => buildSite(shape, i, raw.baseMs))
    const operatoryIds = sites.flatMap((s) => s.operatories.map((o) => o.id))
    const pickOperatory = (slot: number) => operatoryIds[slot % operatoryIds.length]!
    const busy: BusySegment[] = raw.busy.map((b) => ({
      operatoryId: pickOperatory(b.operatorySlot),
      providerId: b.providerId,
      kind: b.kind,
      startMs: raw.baseMs + b.at * MINUTE_MS,
      endMs: raw.baseMs + (b.at + b.length) * MINUTE_MS,
    }))
    return {
      plan: raw.plan,
      capability: raw.capability,
      category: raw.category,
      sites,
      busy,
      fromMs: raw.baseMs,
      toMs: raw.baseMs + raw.rangeMinutes * MINUTE_MS,
      nowMs: raw.baseMs + raw.nowOffset * MINUTE_MS,
      minimumNoticeMinutes: raw.notice,
      providerId: raw.providerId,
      operatoryId: raw.operatorySlot === undefined ? undefined : pickOperatory(raw.operatorySlot),
      preferredProviderId: raw.preferredProviderId,
      preferredSiteId: raw.preferredSiteId,
      partOfDay: raw.partOfDay,
      fewestGaps: raw.fewestGaps,
    }
  })

const ALL = 1_000_000
const key = (o: { siteId: number; operatoryId: number; providerId: number; startMs: number }) => `${o.siteId}/${o.operatoryId}/${o.providerId}@${o.startMs}`

describe('findOpenings against the minute-by-minute reference', () => {
  it('finds exactly the reference openings, in the same order, each conflict-free', () => {
    fc.assert(
      fc.property(queryArb, (query) => {
        const full = { ...query, limit: ALL }
        const engine = findOpenings(full).openings
        const reference = bruteForceOpenings(full)
        expect(new Set(engine.map(key))).toEqual(new Set(reference.map(key)))
        expect(engine.map(key)).toEqual(reference.map(key))
        const index = indexForBruteForce(query.busy)
        for (const opening of engine) expect(firstViolation(query, index, opening)).toBeNull()
      }),
      { numRuns: 300 },
    )
  })

  it('returns the first N of the full ranked list for any limit', () => {
    fc.assert(
      fc.property(queryArb, fc.integer({ min: 1, max: 12 }), (query, limit) => {
        const full = findOpenings({ ...query, limit: ALL }).openings
        expect(findOpenings({ ...query, limit }).openings).toEqual(full.slice(0, limit))
        expect(findOpenings({ ...query, limit: Infinity }).openings).toEqual(full)
      }),
      { numRuns: 200 },
    )
  })

  it('explains an empty result, and each near miss fails exactly the rule it names', () => {
    fc.assert(
      fc.property(queryArb, (query) => {
        const result = findOpenings({ ...query, limit: ALL })
        if (result.openings.length > 0) {
          expect(result.reasons).toBeUndefined()
          return
        }
        expect(result.reasons?.length).toBe(1)
        expect((result.nearest ?? []).length).toBeLessThanOrEqual(3)
        for (const fit of result.nearest ?? []) {
          const index = indexForBruteForce(query.busy)
          const expected = fit.problem === 'chair_busy' ? 'chair busy' : fit.problem === 'provider_busy' ? 'provider hands-on elsewhere' : 'provider off shift'
          expect(firstViolation(query, index, fit)).toBe(expected)
          // Remove what the near miss names and the start becomes a real opening (off shift cannot be removed).
          if (fit.problem === 'provider_off_shift') continue
          const freed = query.busy.filter((b) => (fit.problem === 'chair_busy' ? b.operatoryId !== fit.operatoryId : b.providerId !== fit.providerId))
          expect(firstViolation({ ...query, busy: freed }, indexForBruteForce(freed), fit)).toBeNull()
        }
      }),
      { numRuns: 300 },
    )
  })
})
