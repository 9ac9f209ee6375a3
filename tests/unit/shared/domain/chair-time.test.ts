import { describe, expect, it } from 'vitest'
import { DEFAULT_ANAESTHESIA, planVisit, quadrantLabel } from '../../../../shared/domain/chair-time'
import { DomainValidationError } from '../../../../shared/domain/errors'
import { templateNeedsSurfaces, templateNeedsTooth, validateTemplate } from '../../../../shared/domain/template-validation'
import { DEFAULT_TEMPLATES } from '../../../../seeds/data/procedure-templates'
import type { AnaesthesiaSettings, ChairTimeTemplate, PlanItemInput, PlanSegment, VisitPlan } from '../../../../shared/types/chair-time'

// Engine fixtures with round numbers, so the expected timelines below can be worked out by hand.
// They are not clinical claims; the seed templates are checked against sources further down.
const FIXTURE_ANAESTHESIA: AnaesthesiaSettings = {
  required: true,
  maxillary: {
    technique: 'infiltration',
    infiltration: { injectMinutes: 2, onsetMinutes: 3 },
    block: { injectMinutes: 2, onsetMinutes: 6 },
  },
  mandibular: {
    technique: 'block',
    infiltration: { injectMinutes: 2, onsetMinutes: 4 },
    block: { injectMinutes: 2, onsetMinutes: 10 },
  },
}

const composite: ChairTimeTemplate = {
  code: 'T-COMP',
  name: 'Test composite',
  category: 'restorative',
  capability: 'restorative',
  needsTooth: true,
  needsSurfaces: true,
  version: 3,
  steps: [
    { label: 'Seat composite', kind: 'assist', role: 'seat', baseMinutes: 5, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
    { label: 'Prepare', kind: 'hands_on', role: 'treat', baseMinutes: 12, perExtraSurfaceMinutes: 9, perExtraToothMinutes: 6 },
    { label: 'Restore', kind: 'hands_on', role: 'treat', baseMinutes: 8, perExtraSurfaceMinutes: 6, perExtraToothMinutes: 4 },
    { label: 'Only for extra teeth', kind: 'hands_on', role: 'treat', baseMinutes: 0, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 5 },
    { label: 'Dismiss composite', kind: 'assist', role: 'dismiss', baseMinutes: 3, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
    // No role: a reset step is the turnover by default.
    { label: 'Reset composite', kind: 'reset', baseMinutes: 10, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
  ],
  anaesthesia: FIXTURE_ANAESTHESIA,
}

const exam: ChairTimeTemplate = {
  code: 'T-EXAM',
  name: 'Test exam',
  category: 'exam',
  capability: 'imaging',
  needsTooth: false,
  needsSurfaces: false,
  steps: [
    { label: 'Seat exam', kind: 'assist', role: 'seat', baseMinutes: 8, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
    { label: 'Exam', kind: 'hands_on', baseMinutes: 6, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
    { label: 'Radiograph', kind: 'assist', role: 'treat', baseMinutes: 2, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
    { label: 'Dismiss exam', kind: 'assist', role: 'dismiss', baseMinutes: 2, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
    { label: 'Reset exam', kind: 'reset', role: 'turnover', baseMinutes: 12, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
  ],
  anaesthesia: { ...FIXTURE_ANAESTHESIA, required: false },
}

function item(tooth: string, surfaces: string, extra: Partial<PlanItemInput> = {}): PlanItemInput {
  return { template: composite, tooth, surfaces, ...extra }
}

function shape(plan: VisitPlan): Array<[PlanSegment['kind'], number, number]> {
  return plan.segments.map((s) => [s.kind, s.startMinute, s.endMinute])
}

function fieldOf(run: () => unknown): string {
  try {
    run()
  } catch (error) {
    if (error instanceof DomainValidationError) return error.field
    throw error
  }
  throw new Error('expected a DomainValidationError')
}

function templateByCode(code: string): ChairTimeTemplate {
  const template = DEFAULT_TEMPLATES.find((t) => t.code === code)
  if (!template) throw new Error(`no seed template ${code}`)
  return template
}

describe('planVisit: one tooth', () => {
  it('books a one-surface composite on a lower molar with a block and its onset', () => {
    const plan = planVisit([item('19', 'O')], { unitMinutes: 5 })
    expect(shape(plan)).toEqual([
      ['assist', 0, 5],
      ['hands_on', 5, 7],
      ['numbing', 7, 17],
      ['hands_on', 17, 29],
      ['hands_on', 29, 37],
      ['assist', 37, 40],
      ['reset', 40, 50],
    ])
    expect(plan).toMatchObject({ chairMinutes: 50, rawMinutes: 50, providerMinutes: 22, assistantMinutes: 8, numbingMinutes: 10 })
    expect(plan.anaesthesia).toEqual([
      { quadrant: 3, arch: 'mandibular', technique: 'block', injectMinutes: 2, onsetMinutes: 10, injectAt: 5, readyAt: 17 },
    ])
  })

  it.each([
    ['O', 50],
    ['MO', 65],
    ['MOD', 80],
  ])('grows by the per-surface minutes on a lower molar: %s is %i min', (surfaces, raw) => {
    expect(planVisit([item('19', surfaces)], { unitMinutes: 5 }).rawMinutes).toBe(raw)
  })

  it.each([
    ['O', 43],
    ['MO', 58],
    ['DOB', 73],
  ])('uses the shorter infiltration onset on an upper premolar: %s is %i min', (surfaces, raw) => {
    const plan = planVisit([item('5', surfaces)], { unitMinutes: 5 })
    expect(plan.rawMinutes).toBe(raw)
    expect(plan.numbingMinutes).toBe(3)
    expect(plan.anaesthesia[0]).toMatchObject({ quadrant: 1, technique: 'infiltration', onsetMinutes: 3 })
  })

  it('reads ISO notation the same as Universal', () => {
    const iso = planVisit([item('36', 'MO', { notation: 'iso' })], { unitMinutes: 5 })
    const universal = planVisit([item('19', 'MO')], { unitMinutes: 5 })
    expect(iso.segments).toEqual(universal.segments)
    expect(iso.items[0]?.tooth).toEqual({ iso: '36', universal: '19' })
  })

  it('summarises the item with both tooth numbers, surfaces, class, notes and template', () => {
    const [summary] = planVisit([item('19', 'MOF')], { unitMinutes: 5 }).items
    expect(summary).toMatchObject({
      templateCode: 'T-COMP',
      templateName: 'Test composite',
      templateVersion: 3,
      tooth: { iso: '36', universal: '19' },
      surfaces: ['M', 'O', 'B'],
      blackClass: 'II',
      anaesthesia: 'block',
      treatMinutes: 50,
    })
    expect(summary?.surfaceNotes).toEqual(['F read as B (buccal) on posterior tooth 19'])
  })

  it('takes lesion marks into the class', () => {
    const [summary] = planVisit([item('6', 'F', { lesion: { cervical: true } })], { unitMinutes: 5 }).items
    expect(summary?.blackClass).toBe('V')
  })
})

describe('planVisit: anaesthesia', () => {
  it('shares one injection and one onset between teeth in the same quadrant', () => {
    const plan = planVisit([item('19', 'O'), item('18', 'MO')], { unitMinutes: 5 })
    expect(plan.anaesthesia).toHaveLength(1)
    expect(plan.segments.filter((s) => s.kind === 'numbing')).toHaveLength(1)
    expect(plan.segments.filter((s) => s.quadrant === 3 && s.kind === 'hands_on')).toHaveLength(1)
    expect(plan.rawMinutes).toBe(5 + 2 + 10 + 20 + 35 + 3 + 10)
  })

  it('gives each quadrant its own injection and picks the injection order with the shortest chair time', () => {
    // Lower left block (10 min onset) and upper right infiltration (3 min onset).
    const plan = planVisit([item('19', 'MO'), item('3', 'O')], { unitMinutes: 10 })
    expect(shape(plan)).toEqual([
      ['assist', 0, 5],
      ['hands_on', 5, 7], // upper right first: its short onset ends while the block is given
      ['hands_on', 7, 9], // lower left block; ready at 19, hidden behind the upper tooth's work
      ['numbing', 9, 10],
      ['hands_on', 10, 22], ['hands_on', 22, 30], // tooth 3, 20 min
      ['hands_on', 30, 51], ['hands_on', 51, 65], // tooth 19, 35 min
      ['assist', 65, 68],
      ['reset', 68, 78],
      ['reset', 78, 80],
    ])
    expect(plan.anaesthesia.map((a) => a.quadrant)).toEqual([1, 3])
    expect(plan.numbingMinutes).toBe(1)
    // Injecting in the order given (lower left first) would end at 80; one quadrant after the
    // other (inject, wait, treat, then the next) at 5 + 2 + 10 + 35 + 2 + 3 + 20 + 3 + 10 = 90.
    expect(plan.rawMinutes).toBe(78)
  })

  it('never starts work in a quadrant before its onset has passed', () => {
    const plan = planVisit([item('19', 'MO'), item('3', 'O'), item('14', 'O'), item('30', 'MOD')], { unitMinutes: 5 })
    expect(plan.anaesthesia).toHaveLength(4)
    plan.items.forEach((summary, index) => {
      const firstTreat = plan.segments.find((s) => s.itemIndex === index)
      const quadrant = plan.anaesthesia.find((a) => summary.tooth?.iso.startsWith(String(a.quadrant)))
      expect(firstTreat && quadrant && firstTreat.startMinute >= quadrant.readyAt).toBe(true)
    })
  })

  it("skips anaesthesia for an item marked 'none'", () => {
    const plan = planVisit([item('19', 'O', { anaesthesia: 'none' })], { unitMinutes: 5 })
    expect(plan.anaesthesia).toEqual([])
    expect(plan.segments.some((s) => s.kind === 'numbing' || s.quadrant !== undefined)).toBe(false)
    expect(plan.rawMinutes).toBe(5 + 20 + 3 + 10)
    expect(plan.items[0]?.anaesthesia).toBe('none')
  })

  it('uses the timing of the technique an item asks for', () => {
    const infiltrationBelow = planVisit([item('19', 'O', { anaesthesia: 'infiltration' })], { unitMinutes: 5 })
    expect(infiltrationBelow.anaesthesia[0]).toMatchObject({ technique: 'infiltration', onsetMinutes: 4 })
    expect(infiltrationBelow.rawMinutes).toBe(5 + 2 + 4 + 20 + 3 + 10)
    const blockAbove = planVisit([item('3', 'O', { anaesthesia: 'block' })], { unitMinutes: 5 })
    expect(blockAbove.anaesthesia[0]).toMatchObject({ technique: 'block', onsetMinutes: 6 })
  })

  it('lets a block win when items in one quadrant ask for different techniques', () => {
    const plan = planVisit([item('19', 'O', { anaesthesia: 'infiltration' }), item('20', 'O')], { unitMinutes: 5 })
    expect(plan.anaesthesia).toEqual([expect.objectContaining({ quadrant: 3, technique: 'block', onsetMinutes: 10 })])
  })

  it('can add anaesthesia to a template that does not normally need it', () => {
    const plan = planVisit([{ template: { ...exam, needsTooth: false }, tooth: '30', anaesthesia: 'block' }], { unitMinutes: 5 })
    expect(plan.anaesthesia[0]).toMatchObject({ quadrant: 4, technique: 'block' })
  })

  it('numbs every quadrant an item touches and starts after the last onset', () => {
    const plan = planVisit([item('19', 'O', { teeth: ['14'] })], { unitMinutes: 5 })
    expect(plan.anaesthesia.map((a) => a.quadrant).sort()).toEqual([2, 3])
    const firstTreat = plan.segments.find((s) => s.itemIndex === 0)
    expect(firstTreat?.startMinute).toBe(Math.max(...plan.anaesthesia.map((a) => a.readyAt)))
  })
})

describe('planVisit: merging and templates without a tooth', () => {
  it('books a cleaning or exam without a tooth', () => {
    const plan = planVisit([{ template: exam }], { unitMinutes: 10 })
    expect(plan.rawMinutes).toBe(8 + 6 + 2 + 2 + 12)
    expect(plan.chairMinutes).toBe(30)
    expect(plan.items[0]).toMatchObject({ surfaces: [], blackClass: null, anaesthesia: 'none' })
    expect(plan.items[0]?.tooth).toBeUndefined()
  })

  it('seats, dismisses and resets once, using the longest of each, and fills the onset wait with other work', () => {
    const plan = planVisit([item('19', 'O'), { template: exam }], { unitMinutes: 5 })
    const labels = plan.segments.map((s) => s.label)
    expect(labels.filter((l) => l.startsWith('Seat'))).toEqual(['Seat exam'])
    expect(labels.filter((l) => l.startsWith('Dismiss'))).toEqual(['Dismiss composite'])
    expect(labels.filter((l) => l.startsWith('Reset'))).toEqual(['Reset exam'])
    // Seat 0–8, inject 8–10 (ready 20), exam 10–18 during onset, 2 min wait, composite 20–40.
    expect(shape(plan).slice(0, 6)).toEqual([
      ['assist', 0, 8],
      ['hands_on', 8, 10],
      ['hands_on', 10, 16],
      ['assist', 16, 18],
      ['numbing', 18, 20],
      ['hands_on', 20, 32],
    ])
    expect(plan.rawMinutes).toBe(55)
  })

  it('adds the per-tooth minutes for extra teeth and drops zero-minute steps', () => {
    const one = planVisit([item('19', 'O')], { unitMinutes: 5 })
    const two = planVisit([item('19', 'O', { teeth: ['18'] })], { unitMinutes: 5 })
    expect(one.segments.some((s) => s.label === 'Only for extra teeth')).toBe(false)
    expect(two.segments.find((s) => s.label === 'Only for extra teeth')).toMatchObject({ startMinute: 17 + 18 + 12, endMinute: 17 + 18 + 12 + 5 })
    expect(two.items[0]?.treatMinutes).toBe(20 + 6 + 4 + 5)
    expect(two.items[0]?.extraTeeth).toEqual([{ iso: '37', universal: '18' }])
  })
})

describe('planVisit: rounding to the booking unit', () => {
  it.each([
    [5, 45],
    [10, 50],
    [15, 45],
  ] as const)('rounds 43 raw minutes up to %i-min units: %i', (unitMinutes, chair) => {
    const plan = planVisit([item('5', 'O')], { unitMinutes })
    expect(plan.rawMinutes).toBe(43)
    expect(plan.chairMinutes).toBe(chair)
    const last = plan.segments.at(-1)
    expect(last?.endMinute).toBe(chair)
    if (chair > 43) expect(last).toMatchObject({ kind: 'reset', startMinute: 43 })
  })

  it('adds no spare segment when the raw time is already a whole number of units', () => {
    const plan = planVisit([item('19', 'O')], { unitMinutes: 10 })
    expect(plan.chairMinutes).toBe(50)
    expect(plan.segments.filter((s) => s.label.startsWith('Spare'))).toEqual([])
  })
})

describe('planVisit: explanation', () => {
  it('says in plain words where the time goes', () => {
    const plan = planVisit([item('19', 'MO')], { unitMinutes: 10 })
    expect(plan.explanation).toContain('Seating 5 min')
    expect(plan.explanation).toContain('anaesthetic for the lower left (block) 2 min then 10 min onset')
    expect(plan.explanation).toContain('wait 10 min for the lower left to go numb')
    expect(plan.explanation).toContain('Test composite, tooth 19 MO, 35 min')
    expect(plan.explanation).toContain('5 min added to round up to the 10-minute booking step')
    expect(plan.explanation).toContain('Chair 70 min, provider 37 min')
  })

  it('names teeth in the notation the item used', () => {
    expect(planVisit([item('36', 'O', { notation: 'iso' })], { unitMinutes: 5 }).explanation).toContain('tooth 36 O')
  })
})

describe('planVisit: refuses bad input with a field path', () => {
  it.each([
    ['no items', () => planVisit([], { unitMinutes: 5 }), 'items'],
    ['odd unit', () => planVisit([item('19', 'O')], { unitMinutes: 7 as 5 }), 'unitMinutes'],
    ['missing tooth', () => planVisit([{ template: composite, surfaces: 'O' }], { unitMinutes: 5 }), 'items.0.tooth'],
    ['bad tooth', () => planVisit([item('19', 'O'), item('33', 'O')], { unitMinutes: 5 }), 'items.1.tooth'],
    ['bad surface', () => planVisit([item('19', 'OX')], { unitMinutes: 5 }), 'items.0.surfaces'],
    ['missing surfaces', () => planVisit([{ template: composite, tooth: '19' }], { unitMinutes: 5 }), 'items.0.surfaces'],
    ['repeated tooth', () => planVisit([item('19', 'O', { teeth: ['19'] })], { unitMinutes: 5 }), 'items.0.teeth.0'],
    ['bad extra tooth', () => planVisit([item('19', 'O', { teeth: ['18', 'Z'] })], { unitMinutes: 5 }), 'items.0.teeth.1'],
    ['anaesthesia without tooth', () => planVisit([{ template: exam, anaesthesia: 'block' }], { unitMinutes: 5 }), 'items.0.anaesthesia'],
    ['surfaces without tooth', () => planVisit([{ template: exam, surfaces: 'O' }], { unitMinutes: 5 }), 'items.0.surfaces'],
    ['bad lesion mark', () => planVisit([item('19', 'O', { lesion: { cervical: true } })], { unitMinutes: 5 }), 'items.0.lesion.cervical'],
    [
      'invalid template',
      () => planVisit([{ template: { ...exam, steps: [{ ...exam.steps[1]!, kind: 'numbing' }] } }], { unitMinutes: 5 }),
      'items.0.template.steps.0.kind',
    ],
  ])('%s', (_name, run, field) => {
    expect(fieldOf(run)).toBe(field)
  })

  it('refuses a tooth outside the template region, naming the tooth', () => {
    const posteriorOnly = { ...composite, region: 'posterior' as const }
    expect(fieldOf(() => planVisit([{ template: posteriorOnly, tooth: '8', surfaces: 'M' }], { unitMinutes: 5 }))).toBe('items.0.tooth')
    expect(() => planVisit([{ template: posteriorOnly, tooth: '8', surfaces: 'M' }], { unitMinutes: 5 })).toThrow(/tooth 8 is anterior/)
  })
})

describe('validateTemplate', () => {
  it('accepts the fixtures', () => {
    expect(validateTemplate(composite)).toEqual([])
    expect(validateTemplate(exam)).toEqual([])
  })

  it('lists every problem with its field', () => {
    const broken: ChairTimeTemplate = {
      ...composite,
      code: 'has space',
      name: ' ',
      steps: [
        { label: '', kind: 'hands_on', baseMinutes: -1, perExtraSurfaceMinutes: 1.5, perExtraToothMinutes: 0 },
        { label: 'Wait', kind: 'numbing', baseMinutes: 5, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
        { label: 'Wipe', kind: 'reset', role: 'treat', baseMinutes: 5, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 600 },
      ],
    }
    const fields = validateTemplate(broken).map((issue) => issue.field)
    expect(fields).toEqual([
      'code',
      'name',
      'steps.0.label',
      'steps.0.baseMinutes',
      'steps.0.perExtraSurfaceMinutes',
      'steps.1.kind',
      'steps.2.role',
      'steps.2.perExtraToothMinutes',
    ])
  })

  it('needs at least one step, and one treatment step with minutes', () => {
    expect(validateTemplate({ ...exam, steps: [] })).toEqual([{ field: 'steps', reason: expect.stringContaining('at least one step') }])
    const onlyReset = { ...exam, steps: exam.steps.filter((s) => s.kind === 'reset') }
    expect(validateTemplate(onlyReset).map((i) => i.field)).toEqual(['steps'])
    const zeroTreat = { ...exam, steps: exam.steps.map((s) => ({ ...s, baseMinutes: s.role === 'treat' || !s.role ? 0 : s.baseMinutes })) }
    expect(validateTemplate(zeroTreat).map((i) => i.field)).toEqual(['steps'])
  })

  it('ties anaesthesia and surfaces to needing a tooth', () => {
    const fields = validateTemplate({ ...composite, needsTooth: false }).map((i) => i.field)
    expect(fields).toEqual(expect.arrayContaining(['needsSurfaces', 'anaesthesia.required']))
  })

  it('checks anaesthesia minutes and techniques', () => {
    const badTiming: ChairTimeTemplate = {
      ...composite,
      anaesthesia: {
        ...FIXTURE_ANAESTHESIA,
        mandibular: { ...FIXTURE_ANAESTHESIA.mandibular, block: { injectMinutes: 2, onsetMinutes: -3 } },
      },
    }
    expect(validateTemplate(badTiming).map((i) => i.field)).toEqual(['anaesthesia.mandibular.block.onsetMinutes'])
  })
})

describe('seed templates', () => {
  it('are all valid, with codes of their own', () => {
    for (const template of DEFAULT_TEMPLATES) expect(validateTemplate(template), template.code).toEqual([])
    expect(new Set(DEFAULT_TEMPLATES.map((t) => t.code)).size).toBe(DEFAULT_TEMPLATES.length)
    expect(DEFAULT_TEMPLATES.map((t) => t.code)).toEqual([
      'COMP-POST', 'COMP-ANT', 'SEAL', 'CLEAN-ADULT', 'CLEAN-CHILD', 'EXAM-NEW', 'EXAM-EMER', 'CROWN-PREP', 'EXT-SIMPLE',
    ])
  })

  it('default maxillary infiltration onset covers the published mean', () => {
    // check-values.md: Costa et al., Quintessence Int 2005;36:197–201 — mean pulpal onset 2.8 min
    // (lidocaine 2%, 1:100,000 epinephrine), 1.4 min (articaine 4%). A whole-minute default at or
    // just above the lidocaine mean.
    for (const settings of [DEFAULT_ANAESTHESIA, ...DEFAULT_TEMPLATES.map((t) => t.anaesthesia)]) {
      expect(settings.maxillary.infiltration.onsetMinutes).toBeGreaterThanOrEqual(2.8)
      expect(settings.maxillary.infiltration.onsetMinutes).toBeLessThanOrEqual(4)
    }
  })

  it('default mandibular block onset is inside the published range', () => {
    // check-values.md: clinical reviews of mandibular anaesthesia — IANB pulpal onset commonly 10–15 min.
    for (const settings of [DEFAULT_ANAESTHESIA, ...DEFAULT_TEMPLATES.map((t) => t.anaesthesia)]) {
      expect(settings.mandibular.block.onsetMinutes).toBeGreaterThanOrEqual(10)
      expect(settings.mandibular.block.onsetMinutes).toBeLessThanOrEqual(15)
    }
  })

  it('infiltrates above and blocks below for posterior work', () => {
    // check-values.md: StatPearls "Inferior Alveolar Nerve Block" — infiltration mainly in the maxilla,
    // blocks in the mandible; adult mandibular molars normally need a block.
    expect(DEFAULT_ANAESTHESIA.maxillary.technique).toBe('infiltration')
    expect(DEFAULT_ANAESTHESIA.mandibular.technique).toBe('block')
    for (const code of ['COMP-POST', 'CROWN-PREP', 'EXT-SIMPLE']) {
      expect(templateByCode(code).anaesthesia.mandibular.technique, code).toBe('block')
      expect(templateByCode(code).anaesthesia.maxillary.technique, code).toBe('infiltration')
    }
  })

  it('needs anaesthesia only for the procedures that cut or extract', () => {
    const required = DEFAULT_TEMPLATES.filter((t) => t.anaesthesia.required).map((t) => t.code)
    expect(required).toEqual(['COMP-POST', 'COMP-ANT', 'CROWN-PREP', 'EXT-SIMPLE'])
  })

  it('turn the room over in 10–15 minutes', () => {
    // check-values.md: CDC MMWR 2003;52(RR-17) gives no time; 10–15 min is common practice.
    for (const template of DEFAULT_TEMPLATES) {
      const turnover = template.steps.filter((s) => s.kind === 'reset').reduce((sum, s) => sum + s.baseMinutes, 0)
      expect(turnover, template.code).toBeGreaterThanOrEqual(10)
      expect(turnover, template.code).toBeLessThanOrEqual(15)
    }
  })

  it.each([
    ['19', 'lower molar'],
    ['5', 'upper premolar'],
  ])('book a posterior composite on tooth %s (%s) at about 30/45/60 min for 1/2/3 surfaces', (tooth) => {
    // check-values.md: typical booking lengths, onset not included (common practice, no source).
    // Onset waits and room reset are left out; everything the patient is worked on is counted.
    const template = templateByCode('COMP-POST')
    const bookedLength = (surfaces: string) => {
      const plan = planVisit([{ template, tooth, surfaces }], { unitMinutes: 5 })
      return plan.providerMinutes + plan.assistantMinutes
    }
    expect([bookedLength('O'), bookedLength('MO'), bookedLength('MOD')]).toEqual([30, 45, 60])
  })

  it('model the posterior composite visit step by step', () => {
    // check-values.md "A posterior composite visit, step by step" [common practice]
    const plan = planVisit([{ template: templateByCode('COMP-POST'), tooth: '30', surfaces: 'MO' }], { unitMinutes: 5 })
    const kinds = plan.segments.map((s) => s.kind)
    expect(kinds.slice(0, 3)).toEqual(['assist', 'hands_on', 'numbing'])
    expect(kinds.slice(3, -2).every((k) => k === 'hands_on')).toBe(true)
    expect(kinds.slice(-2)).toEqual(['assist', 'reset'])
  })

  it('book cleanings and exams without a tooth', () => {
    for (const code of ['CLEAN-ADULT', 'CLEAN-CHILD', 'EXAM-NEW', 'EXAM-EMER']) {
      const plan = planVisit([{ template: templateByCode(code) }], { unitMinutes: 15 })
      expect(plan.numbingMinutes, code).toBe(0)
      expect(plan.chairMinutes % 15, code).toBe(0)
    }
  })

  it('keep working when stored without needsTooth, needsSurfaces and region (inferred from the category)', () => {
    for (const template of DEFAULT_TEMPLATES) {
      const stored: ChairTimeTemplate = { ...template, needsTooth: undefined, needsSurfaces: undefined, region: undefined }
      expect(templateNeedsTooth(stored), template.code).toBe(template.needsTooth)
      expect(templateNeedsSurfaces(stored), template.code).toBe(template.needsSurfaces)
      expect(validateTemplate(stored), template.code).toEqual([])
    }
    const stored = { ...templateByCode('COMP-POST'), needsTooth: undefined, needsSurfaces: undefined }
    expect(fieldOf(() => planVisit([{ template: stored, tooth: '19' }], { unitMinutes: 5 }))).toBe('items.0.surfaces')
  })

  it('label quadrants for the explanation', () => {
    expect(quadrantLabel(4)).toBe('lower right')
  })
})
