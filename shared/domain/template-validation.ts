// Plain checks for the template editor and the engine: every problem at once, each with a field path.
// Runtime checks on enum fields too, because templates also arrive as JSON from the editor and the database.
import {
  ANAESTHESIA_TECHNIQUES,
  OPERATORY_CAPABILITIES,
  STEP_KINDS,
  STEP_ROLES,
  TEMPLATE_CATEGORIES,
} from '../types/chair-time'
import type {
  AnaesthesiaTiming,
  ArchAnaesthesia,
  ChairTimeTemplate,
  StepRole,
  TemplateCategory,
  TemplateIssue,
  TemplateStep,
} from '../types/chair-time'
import { MAX_VISIT_MINUTES } from './input-bounds'

/** A generous ceiling that still catches a typed-in 600 meant as 60. */
export const MAX_STEP_MINUTES = 480
const MAX_CODE_LENGTH = 24

function isOneOf(value: unknown, allowed: readonly string[]): boolean {
  return typeof value === 'string' && allowed.includes(value)
}

function minutesIssue(field: string, value: unknown): TemplateIssue[] {
  if (typeof value !== 'number' || !Number.isInteger(value) || value < 0) {
    return [{ field, reason: 'Minutes must be a whole number, 0 or more' }]
  }
  if (value > MAX_STEP_MINUTES) return [{ field, reason: `Minutes must be at most ${MAX_STEP_MINUTES}` }]
  return []
}

const TOOTHLESS_CATEGORIES: readonly TemplateCategory[] = ['hygiene', 'exam']

/** Whether a plan item must name a tooth; inferred from the category when the template does not say. */
export function templateNeedsTooth(template: ChairTimeTemplate): boolean {
  return template.needsTooth ?? !TOOTHLESS_CATEGORIES.includes(template.category)
}

/** Whether a plan item must give surfaces; inferred as "restorative only" when the template does not say. */
export function templateNeedsSurfaces(template: ChairTimeTemplate): boolean {
  return template.needsSurfaces ?? template.category === 'restorative'
}

/** The role a step plays; see StepRole for the default when it has none. */
export function stepRole(step: TemplateStep): StepRole {
  return step.role ?? (step.kind === 'reset' ? 'turnover' : 'treat')
}

// A reset step is the room turnover and nothing else is; seating and dismissal are people's work.
function roleIssues(step: TemplateStep, at: string): TemplateIssue[] {
  if (step.role !== undefined && !isOneOf(step.role, STEP_ROLES)) {
    return [{ field: `${at}.role`, reason: `Role must be one of ${STEP_ROLES.join(', ')}` }]
  }
  const role = stepRole(step)
  if ((role === 'turnover') !== (step.kind === 'reset')) {
    return [{ field: `${at}.role`, reason: 'Room reset steps, and only they, have the turnover role' }]
  }
  return []
}

function stepIssues(step: TemplateStep, index: number): TemplateIssue[] {
  const at = `steps.${index}`
  const issues: TemplateIssue[] = []
  if (typeof step.label !== 'string' || step.label.trim() === '') issues.push({ field: `${at}.label`, reason: 'A step needs a label' })
  if (!isOneOf(step.kind, STEP_KINDS)) {
    issues.push({ field: `${at}.kind`, reason: `Kind must be one of ${STEP_KINDS.join(', ')}` })
  } else if (step.kind === 'numbing') {
    issues.push({ field: `${at}.kind`, reason: 'Onset waits come from the anaesthesia settings, not from a step' })
  } else {
    issues.push(...roleIssues(step, at))
  }
  issues.push(...minutesIssue(`${at}.baseMinutes`, step.baseMinutes))
  issues.push(...minutesIssue(`${at}.perExtraSurfaceMinutes`, step.perExtraSurfaceMinutes))
  issues.push(...minutesIssue(`${at}.perExtraToothMinutes`, step.perExtraToothMinutes))
  return issues
}

function stepsIssues(steps: readonly TemplateStep[]): TemplateIssue[] {
  if (!Array.isArray(steps) || steps.length === 0) return [{ field: 'steps', reason: 'A template needs at least one step' }]
  const issues = steps.flatMap((step, index) => stepIssues(step, index))
  if (issues.length > 0) return issues
  const oneToothMinutes = steps.reduce((sum, step) => sum + step.baseMinutes, 0)
  if (oneToothMinutes > MAX_VISIT_MINUTES) {
    return [{ field: 'steps', reason: `The steps add up to ${oneToothMinutes} minutes for a single tooth and surface; one visit is at most ${MAX_VISIT_MINUTES} minutes (8 hours)` }]
  }
  const treatSteps = steps.filter((step) => stepRole(step) === 'treat')
  if (treatSteps.length === 0) return [{ field: 'steps', reason: 'A template needs at least one treatment step' }]
  if (treatSteps.every((step) => step.baseMinutes === 0)) {
    return [{ field: 'steps', reason: 'The treatment steps need some minutes for a single tooth and surface' }]
  }
  return []
}

function timingIssues(timing: AnaesthesiaTiming, at: string): TemplateIssue[] {
  if (typeof timing !== 'object' || timing === null) return [{ field: at, reason: 'Anaesthesia timing is missing' }]
  return [...minutesIssue(`${at}.injectMinutes`, timing.injectMinutes), ...minutesIssue(`${at}.onsetMinutes`, timing.onsetMinutes)]
}

function archIssues(arch: ArchAnaesthesia, at: string): TemplateIssue[] {
  if (typeof arch !== 'object' || arch === null) return [{ field: at, reason: 'Anaesthesia settings for this arch are missing' }]
  const issues: TemplateIssue[] = []
  if (!isOneOf(arch.technique, ANAESTHESIA_TECHNIQUES)) {
    issues.push({ field: `${at}.technique`, reason: `Technique must be one of ${ANAESTHESIA_TECHNIQUES.join(', ')}` })
  }
  for (const technique of ANAESTHESIA_TECHNIQUES) issues.push(...timingIssues(arch[technique], `${at}.${technique}`))
  return issues
}

function anaesthesiaIssues(template: ChairTimeTemplate): TemplateIssue[] {
  const settings = template.anaesthesia
  if (typeof settings !== 'object' || settings === null) return [{ field: 'anaesthesia', reason: 'Anaesthesia settings are missing' }]
  const issues = [...archIssues(settings.maxillary, 'anaesthesia.maxillary'), ...archIssues(settings.mandibular, 'anaesthesia.mandibular')]
  if (typeof settings.required !== 'boolean') issues.push({ field: 'anaesthesia.required', reason: 'Say whether anaesthesia is required' })
  // The onset wait is per quadrant, so the engine must know the tooth.
  if (settings.required && !templateNeedsTooth(template)) {
    issues.push({ field: 'anaesthesia.required', reason: 'A template that needs anaesthesia must also need a tooth' })
  }
  return issues
}

function identityIssues(template: ChairTimeTemplate): TemplateIssue[] {
  const issues: TemplateIssue[] = []
  const code = typeof template.code === 'string' ? template.code.trim() : ''
  if (code === '' || /\s/.test(code) || code.length > MAX_CODE_LENGTH) {
    issues.push({ field: 'code', reason: `A code is 1–${MAX_CODE_LENGTH} characters without spaces` })
  }
  if (typeof template.name !== 'string' || template.name.trim() === '') issues.push({ field: 'name', reason: 'A template needs a name' })
  if (!isOneOf(template.category, TEMPLATE_CATEGORIES)) {
    issues.push({ field: 'category', reason: `Category must be one of ${TEMPLATE_CATEGORIES.join(', ')}` })
  }
  if (!isOneOf(template.capability, OPERATORY_CAPABILITIES)) {
    issues.push({ field: 'capability', reason: `Capability must be one of ${OPERATORY_CAPABILITIES.join(', ')}` })
  }
  if (template.version !== undefined && (!Number.isInteger(template.version) || template.version < 1)) {
    issues.push({ field: 'version', reason: 'Version is a whole number from 1' })
  }
  return issues
}

function toothRuleIssues(template: ChairTimeTemplate): TemplateIssue[] {
  const issues: TemplateIssue[] = []
  for (const flag of ['needsTooth', 'needsSurfaces'] as const) {
    const value = template[flag]
    if (value !== undefined && typeof value !== 'boolean') issues.push({ field: flag, reason: 'Must be true or false' })
  }
  if (templateNeedsSurfaces(template) && !templateNeedsTooth(template)) {
    issues.push({ field: 'needsSurfaces', reason: 'A template that needs surfaces must also need a tooth' })
  }
  if (template.region !== undefined && !isOneOf(template.region, ['anterior', 'posterior'])) {
    issues.push({ field: 'region', reason: 'Region must be anterior or posterior' })
  }
  return issues
}

/** Every problem with a template; an empty list means the engine can use it. */
export function validateTemplate(template: ChairTimeTemplate): TemplateIssue[] {
  return [...identityIssues(template), ...toothRuleIssues(template), ...stepsIssues(template.steps), ...anaesthesiaIssues(template)]
}
