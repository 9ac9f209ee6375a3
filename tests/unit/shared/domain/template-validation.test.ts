// The template editor's and the engine's checks: every problem at once, each with a field path.
import { describe, expect, it } from 'vitest'
import { MAX_STEP_MINUTES, stepRole, templateNeedsSurfaces, templateNeedsTooth, validateTemplate } from '../../../../shared/domain/template-validation'
import type { ChairTimeTemplate, TemplateStep } from '../../../../shared/types/chair-time'
import { DEFAULT_TEMPLATES } from '../../../../seeds/data/procedure-templates'

const composite = (): ChairTimeTemplate => structuredClone(DEFAULT_TEMPLATES.find((template) => template.code === 'COMP-POST')!)
const fieldsOf = (template: ChairTimeTemplate) => validateTemplate(template).map((issue) => issue.field)

describe('validateTemplate', () => {
  it('accepts every demo template', () => {
    for (const template of DEFAULT_TEMPLATES) expect(validateTemplate(template), template.code).toEqual([])
  })

  it('names each wrong field of the identity at once', () => {
    const template = { ...composite(), code: 'has space', name: ' ', category: 'surgery', capability: 'laser', version: 0 } as unknown as ChairTimeTemplate
    expect(fieldsOf(template)).toEqual(['code', 'name', 'category', 'capability', 'version'])
  })

  it('checks step minutes: whole numbers from 0 to the ceiling', () => {
    const template = composite()
    template.steps[1] = { ...template.steps[1]!, baseMinutes: 600 }
    template.steps[2] = { ...template.steps[2]!, perExtraSurfaceMinutes: 1.5 }
    const issues = validateTemplate(template)
    expect(issues).toContainEqual({ field: 'steps.1.baseMinutes', reason: `Minutes must be at most ${MAX_STEP_MINUTES}` })
    expect(issues).toContainEqual({ field: 'steps.2.perExtraSurfaceMinutes', reason: 'Minutes must be a whole number, 0 or more' })
  })

  it('keeps the onset wait out of the steps and the turnover role on reset steps only', () => {
    const template = composite()
    template.steps[0] = { ...template.steps[0]!, kind: 'numbing' } as TemplateStep
    template.steps[1] = { ...template.steps[1]!, role: 'turnover' } as TemplateStep
    expect(fieldsOf(template)).toEqual(['steps.0.kind', 'steps.1.role'])
  })

  it('needs a treatment step with minutes, and anaesthesia only where there is a tooth', () => {
    const noTreatment = composite()
    noTreatment.steps = noTreatment.steps.filter((step) => stepRole(step) !== 'treat')
    expect(validateTemplate(noTreatment)).toEqual([{ field: 'steps', reason: 'A template needs at least one treatment step' }])
    const toothless = { ...composite(), needsTooth: false, needsSurfaces: false }
    expect(fieldsOf(toothless)).toEqual(['anaesthesia.required'])
  })
})

describe('tooth and surface rules', () => {
  it('infer from the category when the template does not say', () => {
    const { needsTooth: _tooth, needsSurfaces: _surfaces, ...rest } = composite()
    expect(templateNeedsTooth(rest as ChairTimeTemplate)).toBe(true)
    expect(templateNeedsSurfaces(rest as ChairTimeTemplate)).toBe(true)
    expect(templateNeedsTooth({ ...rest, category: 'hygiene' } as ChairTimeTemplate)).toBe(false)
  })
})
