// Properties of the chair-time engine over random templates, teeth, surfaces and overrides.
// Common practice, no source: these check the engine's own promises, not clinical values.
import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import { planVisit } from '../../../../shared/domain/chair-time'
import { DomainValidationError } from '../../../../shared/domain/errors'
import { MAX_VISIT_MINUTES } from '../../../../shared/domain/input-bounds'
import { validSurfacesFor } from '../../../../shared/domain/surfaces'
import { allTeeth, formatTooth, toothFromIso } from '../../../../shared/domain/teeth'
import type {
  AnaesthesiaChoice,
  AnaesthesiaTiming,
  ArchAnaesthesia,
  BookingUnitMinutes,
  ChairTimeTemplate,
  PlanItemInput,
  StepKind,
  StepRole,
  TemplateStep,
  VisitPlan,
} from '../../../../shared/types/chair-time'
import type { Quadrant, Tooth } from '../../../../shared/types/teeth'

const minutes = (max: number) => fc.integer({ min: 0, max })

function stepArb(role: StepRole, kinds: readonly StepKind[], minBase = 0): fc.Arbitrary<TemplateStep> {
  return fc.record({
    label: fc.constantFrom('Alpha', 'Beta', 'Gamma', 'Delta'),
    kind: fc.constantFrom(...kinds),
    role: fc.constant(role),
    baseMinutes: fc.integer({ min: minBase, max: 30 }),
    perExtraSurfaceMinutes: minutes(15),
    perExtraToothMinutes: minutes(15),
  })
}

const timingArb: fc.Arbitrary<AnaesthesiaTiming> = fc.record({ injectMinutes: minutes(5), onsetMinutes: minutes(20) })
const archArb: fc.Arbitrary<ArchAnaesthesia> = fc.record({
  technique: fc.constantFrom('infiltration' as const, 'block' as const),
  infiltration: timingArb,
  block: timingArb,
})

function templateArb(needsTooth: boolean): fc.Arbitrary<ChairTimeTemplate> {
  return fc
    .record({
      seat: fc.array(stepArb('seat', ['assist', 'hands_on']), { maxLength: 2 }),
      firstTreat: stepArb('treat', ['hands_on', 'assist'], 1),
      moreTreat: fc.array(stepArb('treat', ['hands_on', 'assist']), { maxLength: 3 }),
      dismiss: fc.array(stepArb('dismiss', ['assist']), { maxLength: 2 }),
      turnover: fc.array(stepArb('turnover', ['reset']), { maxLength: 1 }),
      required: needsTooth ? fc.boolean() : fc.constant(false),
      needsSurfaces: needsTooth ? fc.boolean() : fc.constant(false),
      maxillary: archArb,
      mandibular: archArb,
      code: fc.constantFrom('P-1', 'P-2', 'P-3'),
    })
    .map((r) => ({
      code: r.code,
      name: `Template ${r.code}`,
      category: 'restorative' as const,
      capability: 'restorative' as const,
      needsTooth,
      needsSurfaces: r.needsSurfaces,
      // Roles, not step order, place steps in the visit, so mix the order up.
      steps: [...r.turnover, r.firstTreat, ...r.dismiss, ...r.moreTreat, ...r.seat],
      anaesthesia: { required: r.required, maxillary: r.maxillary, mandibular: r.mandibular },
    }))
}

const toothArb = fc.constantFrom(...allTeeth())

const toothItemArb: fc.Arbitrary<PlanItemInput> = fc
  .record({
    template: templateArb(true),
    tooth: toothArb,
    extra: fc.subarray(allTeeth().slice(0, 12), { maxLength: 2 }),
    notation: fc.constantFrom('universal' as const, 'iso' as const),
    anaesthesia: fc.constantFrom<AnaesthesiaChoice | undefined>(undefined, 'none', 'infiltration', 'block'),
  })
  .chain((r) =>
    fc.shuffledSubarray(validSurfacesFor(r.tooth), { minLength: 1 }).map((surfaces) => ({
      template: r.template,
      tooth: formatTooth(r.tooth, r.notation),
      notation: r.notation,
      surfaces: surfaces.join(''),
      teeth: r.extra.filter((t) => t.iso !== r.tooth.iso).map((t) => formatTooth(t, r.notation)),
      ...(r.anaesthesia === undefined ? {} : { anaesthesia: r.anaesthesia }),
    })),
  )

const toothlessItemArb: fc.Arbitrary<PlanItemInput> = templateArb(false).map((template) => ({ template }))

const itemsArb = fc.array(fc.oneof({ weight: 4, arbitrary: toothItemArb }, { weight: 1, arbitrary: toothlessItemArb }), {
  minLength: 1,
  maxLength: 4,
})
const unitArb = fc.constantFrom<BookingUnitMinutes>(5, 10, 15)

function segmentMinutes(plan: VisitPlan, kind: StepKind): number {
  return plan.segments.filter((s) => s.kind === kind).reduce((sum, s) => sum + s.endMinute - s.startMinute, 0)
}

function teethOf(plan: VisitPlan, index: number): Tooth[] {
  const summary = plan.items[index]
  if (!summary) return []
  return [summary.tooth, ...summary.extraTeeth].flatMap((t) => (t ? [toothFromIso(t.iso)].filter((x): x is Tooth => !!x) : []))
}

function quadrantsOf(plan: VisitPlan, index: number): Set<Quadrant> {
  return new Set(teethOf(plan, index).map((t) => t.quadrant))
}

/** planVisit, or a skipped case when the random plan is longer than one visit may be (that refusal has its own property below). */
function planWithin(items: PlanItemInput[], options: { unitMinutes: BookingUnitMinutes }): VisitPlan {
  try {
    return planVisit(items, options)
  } catch (error) {
    if (error instanceof DomainValidationError && error.field === 'items' && error.reason.includes(`at most ${MAX_VISIT_MINUTES} minutes`)) fc.pre(false)
    throw error
  }
}

describe('planVisit properties', () => {
  it(`refuses a plan longer than ${MAX_VISIT_MINUTES} minutes naming items, and every plan it accepts is at most that`, () => {
    let refused = 0
    fc.assert(
      fc.property(itemsArb, unitArb, (items, unitMinutes) => {
        try {
          expect(planVisit(items, { unitMinutes }).chairMinutes).toBeLessThanOrEqual(MAX_VISIT_MINUTES)
        } catch (error) {
          if (!(error instanceof DomainValidationError)) throw error
          expect(error.field).toBe('items')
          expect(error.reason).toMatch(/book them as two visits/)
          refused += 1
        }
      }),
      { numRuns: 300 },
    )
    // The random templates reach past the limit often enough for the refusal to be exercised.
    expect(refused).toBeGreaterThan(0)
  })

  it('segments run contiguously from 0 to chairMinutes, none empty', () => {
    fc.assert(
      fc.property(itemsArb, unitArb, (items, unitMinutes) => {
        const plan = planWithin(items, { unitMinutes })
        expect(plan.segments[0]?.startMinute).toBe(0)
        plan.segments.forEach((segment, i) => {
          expect(segment.endMinute).toBeGreaterThan(segment.startMinute)
          if (i > 0) expect(segment.startMinute).toBe(plan.segments[i - 1]?.endMinute)
        })
        expect(plan.segments.at(-1)?.endMinute).toBe(plan.chairMinutes)
      }),
    )
  })

  it('chairMinutes is the smallest multiple of the unit at or above rawMinutes', () => {
    fc.assert(
      fc.property(itemsArb, unitArb, (items, unitMinutes) => {
        const plan = planWithin(items, { unitMinutes })
        expect(plan.chairMinutes % unitMinutes).toBe(0)
        expect(plan.chairMinutes).toBeGreaterThanOrEqual(plan.rawMinutes)
        expect(plan.chairMinutes - plan.rawMinutes).toBeLessThan(unitMinutes)
      }),
    )
  })

  it('totals add up, and provider minutes never exceed chair minutes', () => {
    fc.assert(
      fc.property(itemsArb, unitArb, (items, unitMinutes) => {
        const plan = planWithin(items, { unitMinutes })
        expect(plan.providerMinutes).toBeLessThanOrEqual(plan.chairMinutes)
        expect(plan.providerMinutes).toBe(segmentMinutes(plan, 'hands_on'))
        expect(plan.assistantMinutes).toBe(segmentMinutes(plan, 'assist'))
        expect(plan.numbingMinutes).toBe(segmentMinutes(plan, 'numbing'))
        expect(plan.providerMinutes + plan.assistantMinutes + plan.numbingMinutes + segmentMinutes(plan, 'reset')).toBe(plan.chairMinutes)
      }),
    )
  })

  it('adding a surface never shortens a visit', () => {
    fc.assert(
      fc.property(itemsArb, unitArb, fc.nat(), (items, unitMinutes, pick) => {
        const index = items.findIndex((item) => item.tooth !== undefined)
        const target = items[index]
        if (!target?.tooth) return
        const tooth = teethOf(planWithin(items, { unitMinutes }), index)[0]
        if (!tooth) return
        const missing = validSurfacesFor(tooth).filter((s) => !(target.surfaces ?? '').includes(s))
        const added = missing[pick % Math.max(1, missing.length)]
        if (!added) return
        const before = planWithin(items, { unitMinutes })
        const grown = items.map((item, i) => (i === index ? { ...item, surfaces: `${item.surfaces ?? ''}${added}` } : item))
        const after = planWithin(grown, { unitMinutes })
        expect(after.rawMinutes).toBeGreaterThanOrEqual(before.rawMinutes)
        expect(after.chairMinutes).toBeGreaterThanOrEqual(before.chairMinutes)
      }),
    )
  })

  it('a numbing segment is never hands-on work: it waits for a quadrant and ends when that quadrant is ready', () => {
    fc.assert(
      fc.property(itemsArb, unitArb, (items, unitMinutes) => {
        const plan = planWithin(items, { unitMinutes })
        plan.segments.forEach((segment, i) => {
          if (segment.kind !== 'numbing') return
          const planned = plan.anaesthesia.find((a) => a.quadrant === segment.quadrant)
          expect(planned?.readyAt).toBe(segment.endMinute)
          const next = plan.segments[i + 1]
          expect(next?.itemIndex).toBeDefined()
          expect(quadrantsOf(plan, next?.itemIndex ?? -1).has(segment.quadrant ?? 1)).toBe(true)
        })
        // No hands-on minute lies inside a numbing interval.
        const numbing = plan.segments.filter((s) => s.kind === 'numbing')
        for (const work of plan.segments.filter((s) => s.kind === 'hands_on')) {
          for (const wait of numbing) expect(work.endMinute <= wait.startMinute || work.startMinute >= wait.endMinute).toBe(true)
        }
      }),
    )
  })

  it('work in a quadrant starts only after its injection and onset', () => {
    fc.assert(
      fc.property(itemsArb, unitArb, (items, unitMinutes) => {
        const plan = planWithin(items, { unitMinutes })
        for (const planned of plan.anaesthesia) {
          expect(planned.readyAt).toBe(planned.injectAt + planned.injectMinutes + planned.onsetMinutes)
          if (planned.injectMinutes > 0) {
            const shot = plan.segments.find((s) => s.kind === 'hands_on' && s.quadrant === planned.quadrant)
            expect(shot).toMatchObject({ startMinute: planned.injectAt, endMinute: planned.injectAt + planned.injectMinutes })
          }
        }
        plan.items.forEach((summary, index) => {
          if (summary.anaesthesia === 'none') return
          const firstTreat = plan.segments.find((s) => s.itemIndex === index)
          for (const quadrant of quadrantsOf(plan, index)) {
            const planned = plan.anaesthesia.find((a) => a.quadrant === quadrant)
            expect(planned).toBeDefined()
            expect(firstTreat?.startMinute ?? 0).toBeGreaterThanOrEqual(planned?.readyAt ?? Infinity)
          }
        })
      }),
    )
  })

  it("uses the template's mandibular block onset for mandibular teeth when its settings say block", () => {
    fc.assert(
      fc.property(itemsArb, unitArb, (items, unitMinutes) => {
        const plan = planWithin(items, { unitMinutes })
        items.forEach((item, index) => {
          const { anaesthesia } = item.template
          if (item.anaesthesia !== undefined || !anaesthesia.required || anaesthesia.mandibular.technique !== 'block') return
          for (const tooth of teethOf(plan, index).filter((t) => t.arch === 'mandibular')) {
            const planned = plan.anaesthesia.find((a) => a.quadrant === tooth.quadrant)
            expect(planned?.technique).toBe('block')
            expect(planned?.onsetMinutes ?? -1).toBeGreaterThanOrEqual(anaesthesia.mandibular.block.onsetMinutes)
            const othersInQuadrant = plan.items.filter((s, i) => i !== index && s.anaesthesia !== 'none' && quadrantsOf(plan, i).has(tooth.quadrant))
            if (othersInQuadrant.length === 0) expect(planned?.onsetMinutes).toBe(anaesthesia.mandibular.block.onsetMinutes)
          }
        })
      }),
    )
  })

  it('onset waits overlap each other and other work: the chair never waits longer than the longest onset', () => {
    fc.assert(
      fc.property(itemsArb, unitArb, (items, unitMinutes) => {
        const plan = planWithin(items, { unitMinutes })
        const longestOnset = Math.max(0, ...plan.anaesthesia.map((a) => a.onsetMinutes))
        expect(plan.numbingMinutes).toBeLessThanOrEqual(longestOnset)
      }),
    )
  })

  it('the order items are listed in does not change the raw chair time', () => {
    fc.assert(
      fc.property(itemsArb, unitArb, (items, unitMinutes) => {
        const forward = planWithin(items, { unitMinutes })
        const backward = planWithin([...items].reverse(), { unitMinutes })
        expect(backward.rawMinutes).toBe(forward.rawMinutes)
      }),
    )
  })

  it('matches a brute-force search over every order of injections and treatments', () => {
    // Independent oracle: try every order of the jobs (one injection per planned quadrant, one
    // treatment per item) in which no treatment comes before the injections it depends on.
    const smallItemsArb = fc.array(fc.oneof(toothItemArb.map((item) => ({ ...item, teeth: [] })), toothlessItemArb), {
      minLength: 1,
      maxLength: 3,
    })
    fc.assert(
      fc.property(smallItemsArb, (items) => {
        const plan = planWithin(items, { unitMinutes: 5 })
        const core = plan.segments.filter((s) => s.itemIndex !== undefined || s.quadrant !== undefined)
        const engineSpan = (core.at(-1)?.endMinute ?? 0) - (core[0]?.startMinute ?? 0)
        expect(engineSpan).toBe(bruteForceSpan(plan))
      }),
      { numRuns: 60 },
    )
  })

  it('is deterministic', () => {
    fc.assert(
      fc.property(itemsArb, unitArb, (items, unitMinutes) => {
        expect(planWithin(items, { unitMinutes })).toEqual(planWithin(items, { unitMinutes }))
      }),
    )
  })
})

type Job = { injection: Quadrant } | { item: number }

function orders<T>(list: readonly T[]): T[][] {
  if (list.length <= 1) return [[...list]]
  return list.flatMap((head, i) => orders([...list.slice(0, i), ...list.slice(i + 1)]).map((rest) => [head, ...rest]))
}

function spanOf(plan: VisitPlan, order: readonly Job[]): number | undefined {
  let now = 0
  const ready = new Map<Quadrant, number>()
  for (const job of order) {
    if ('injection' in job) {
      const planned = plan.anaesthesia.find((a) => a.quadrant === job.injection)
      now += planned?.injectMinutes ?? 0
      ready.set(job.injection, now + (planned?.onsetMinutes ?? 0))
      continue
    }
    const summary = plan.items[job.item]
    const needed = summary?.anaesthesia === 'none' ? [] : [...quadrantsOf(plan, job.item)]
    if (needed.some((q) => !ready.has(q))) return undefined
    now = Math.max(now, ...needed.map((q) => ready.get(q) ?? 0)) + (summary?.treatMinutes ?? 0)
  }
  return now
}

function bruteForceSpan(plan: VisitPlan): number {
  const jobs: Job[] = [...plan.anaesthesia.map((a) => ({ injection: a.quadrant })), ...plan.items.map((_, item) => ({ item }))]
  const spans = orders(jobs).map((order) => spanOf(plan, order)).filter((span): span is number => span !== undefined)
  return Math.min(...spans)
}
