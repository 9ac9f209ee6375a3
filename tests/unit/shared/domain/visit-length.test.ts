// The longest visit (MAX_VISIT_MINUTES, shared/domain/input-bounds.ts): one rule that the plan, a
// length set by hand and a template are held to, and that overlap reads use as their lower bound.
// Common practice, no source: the 8-hour ceiling is this project's own rule.
import { describe, expect, it } from 'vitest'
import { planVisit } from '../../../../shared/domain/chair-time'
import { DomainValidationError } from '../../../../shared/domain/errors'
import { earliestOverlappingStart, MAX_VISIT_MINUTES } from '../../../../shared/domain/input-bounds'
import { withChairMinutes } from '../../../../shared/domain/length-override'
import { templateNeedsSurfaces, templateNeedsTooth, validateTemplate } from '../../../../shared/domain/template-validation'
import type { ChairTimeTemplate } from '../../../../shared/types/chair-time'
import { DEFAULT_TEMPLATES } from '../../../../seeds/data/procedure-templates'

const template = (code: string): ChairTimeTemplate => structuredClone(DEFAULT_TEMPLATES.find((candidate) => candidate.code === code)!)
const MOLARS = ['2', '3', '14', '15', '18', '19', '30', '31']

describe('the longest visit', () => {
  it('is 8 hours', () => {
    expect(MAX_VISIT_MINUTES).toBe(480)
  })

  it('refuses a plan longer than that, naming items; four large fillings still fit', () => {
    const fillings = (teeth: string[]) => teeth.map((tooth) => ({ template: template('COMP-POST'), tooth, surfaces: 'MODB' }))
    expect(planVisit(fillings(MOLARS.slice(0, 4)), { unitMinutes: 5 }).chairMinutes).toBeLessThanOrEqual(MAX_VISIT_MINUTES)
    let refusal: unknown
    try {
      planVisit(fillings(MOLARS), { unitMinutes: 5 })
    } catch (error) {
      refusal = error
    }
    expect(refusal).toBeInstanceOf(DomainValidationError)
    expect(refusal).toMatchObject({ field: 'items' })
    expect((refusal as DomainValidationError).reason).toMatch(/need \d+ minutes in the chair; one visit is at most 480 minutes/)
  })

  it('every demo template, alone on its largest single tooth, fits (the demo seeds and the group-scale generator book only these)', () => {
    for (const demo of DEFAULT_TEMPLATES) {
      const anterior = demo.region === 'anterior'
      const tooth = templateNeedsTooth(demo) ? { tooth: anterior ? '8' : '19' } : {}
      const surfaces = templateNeedsSurfaces(demo) ? { surfaces: anterior ? 'MIDF' : 'MODB' } : {}
      expect(planVisit([{ template: demo, ...tooth, ...surfaces }], { unitMinutes: 15 }).chairMinutes, demo.code).toBeLessThanOrEqual(MAX_VISIT_MINUTES)
    }
  })

  it('holds a length set by hand to it', () => {
    const plan = planVisit([{ template: template('COMP-POST'), tooth: '19', surfaces: 'MO' }], { unitMinutes: 5 })
    expect(withChairMinutes(plan, MAX_VISIT_MINUTES, 'long sedation').chairMinutes).toBe(MAX_VISIT_MINUTES)
    expect(() => withChairMinutes(plan, MAX_VISIT_MINUTES + 5, 'longer')).toThrow(/at most 480 minutes/)
  })

  it('refuses a template whose steps alone add up to more, naming steps', () => {
    const long = template('CROWN-PREP')
    long.steps = long.steps.map((step) => ({ ...step, baseMinutes: step.kind === 'reset' ? step.baseMinutes : 400 }))
    expect(validateTemplate(long)).toContainEqual({ field: 'steps', reason: expect.stringMatching(/add up to \d+ minutes for a single tooth and surface; one visit is at most 480 minutes/) })
  })

  it('gives overlap reads their lower bound: the latest start that cannot reach the window', () => {
    const fromMs = Date.UTC(2030, 0, 7, 15, 0)
    expect(earliestOverlappingStart(fromMs).toISOString()).toBe('2030-01-07T07:00:00.000Z')
    // A visit of the longest length starting exactly there ends exactly at fromMs: no overlap, so `>` is right.
    expect(earliestOverlappingStart(fromMs).getTime() + MAX_VISIT_MINUTES * 60_000).toBe(fromMs)
  })
})
