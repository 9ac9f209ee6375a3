// The chair-time engine: plan items (template + tooth + surfaces) merged into one visit timeline.
//
// Shape of every visit: seating → anaesthetic injections → treatment → dismissal → room reset,
// then spare minutes up to the booking unit. Seating, dismissal and reset happen once per visit
// (see StepRole); anaesthesia happens once per quadrant that needs it.
//
// Order, chosen for the shortest chair time without starting work before onset:
// 1. All injections come straight after seating. Giving an injection earlier never delays anything
//    (its onset starts sooner), so no schedule beats injecting first.
// 2. Items without anaesthesia come next: they fill the onset wait instead of the chair standing idle.
// 3. Anaesthetised items follow in the order their quadrants are ready (earliest first, then the
//    order given), which is the shortest order for jobs that each have a ready time.
// 4. The order of the injections themselves is tried in every permutation (at most 4! = 24) and
//    the shortest kept; ties keep the order of first appearance. Injecting the quick infiltration
//    first can hide a mandibular block's longer onset behind the treatment of the upper tooth.
// A `numbing` segment appears only where the chair would otherwise wait; onset that passes while
// other work is under way is not shown twice.
import { classifyCavity } from './black-class'
import { MAX_VISIT_MINUTES } from './input-bounds'
import { DomainValidationError } from './errors'
import { parseSurfaces } from './surfaces'
import { formatTooth, parseTooth, quadrantLabel, toothLabel } from './teeth'
import { stepRole, templateNeedsSurfaces, templateNeedsTooth, validateTemplate } from './template-validation'
import type {
  AnaesthesiaChoice,
  AnaesthesiaSettings,
  AnaesthesiaTechnique,
  BookingUnitMinutes,
  ChairTimeTemplate,
  PlanItemInput,
  PlanItemSummary,
  PlannedAnaesthesia,
  PlanOptions,
  PlanSegment,
  StepKind,
  StepRole,
  TemplateStep,
  VisitPlan,
} from '../types/chair-time'
import type { Arch, BlackClass, Quadrant, Surface, Tooth, ToothNotation } from '../types/teeth'

export { quadrantLabel }

/**
 * Practice defaults for local anaesthetic timing (check-values.md; the clinician decides).
 * - Maxillary infiltration onset 3 min: Costa et al., Quintessence Int 2005;36:197–201, mean pulpal
 *   onset 2.8 min for lidocaine 2% with 1:100,000 epinephrine.
 * - Mandibular block onset 10 min: clinical reviews of mandibular anaesthesia give pulpal onset of an
 *   inferior alveolar nerve block as commonly 10–15 min; the lower end, raise it if your waits run longer.
 * - Infiltration in the maxilla, block in the mandible: StatPearls, "Inferior Alveolar Nerve Block".
 * - Maxillary block onset 5 min, mandibular infiltration onset 5 min, and injection times of 2 min
 *   (a slow cartridge): from memory.
 */
export const DEFAULT_ANAESTHESIA: AnaesthesiaSettings = {
  required: true,
  maxillary: {
    technique: 'infiltration',
    infiltration: { injectMinutes: 2, onsetMinutes: 3 },
    block: { injectMinutes: 2, onsetMinutes: 5 },
  },
  mandibular: {
    technique: 'block',
    infiltration: { injectMinutes: 2, onsetMinutes: 5 },
    block: { injectMinutes: 2, onsetMinutes: 10 },
  },
}

const BOOKING_UNITS: readonly BookingUnitMinutes[] = [5, 10, 15]

interface TimedStep {
  label: string
  kind: StepKind
  minutes: number
}

interface ResolvedItem {
  index: number
  template: ChairTimeTemplate
  notation: ToothNotation
  tooth?: Tooth
  extraTeeth: Tooth[]
  surfaces: Surface[]
  surfaceNotes: string[]
  blackClass: BlackClass | null
  /** Technique per quadrant this item needs numb; empty when it needs no anaesthesia. */
  anaesthesiaNeeds: QuadrantNeed[]
  stepsByRole: Record<StepRole, TimedStep[]>
}

interface QuadrantNeed {
  quadrant: Quadrant
  arch: Arch
  technique: AnaesthesiaTechnique
  injectMinutes: number
  onsetMinutes: number
}

// ---------------------------------------------------------------- item resolution

function fail(field: string, reason: string): never {
  throw new DomainValidationError(field, reason)
}

// Errors from the tooth and cavity helpers name a bare field; a plan names the item too.
function underField<T>(prefix: string, run: () => T): T {
  try {
    return run()
  } catch (error) {
    if (error instanceof DomainValidationError) throw new DomainValidationError(`${prefix}.${error.field}`, error.reason)
    throw error
  }
}

function checkTemplate(template: ChairTimeTemplate, at: string): void {
  const [first] = validateTemplate(template)
  if (first) fail(`${at}.template.${first.field}`, first.reason)
}

function checkRegion(template: ChairTimeTemplate, tooth: Tooth, notation: ToothNotation, field: string): void {
  if (template.region && tooth.region !== template.region) {
    fail(field, `${template.name} is for ${template.region} teeth; ${toothLabel(tooth, notation)} is ${tooth.region}`)
  }
}

function resolveTeeth(input: PlanItemInput, notation: ToothNotation, at: string): { tooth?: Tooth; extraTeeth: Tooth[] } {
  const { template } = input
  const given = input.tooth?.trim() ? input.tooth : undefined
  if (!given) {
    if (templateNeedsTooth(template)) fail(`${at}.tooth`, `${template.name} needs a tooth`)
    if (input.teeth?.length) fail(`${at}.tooth`, 'Give the main tooth before further teeth')
    return { extraTeeth: [] }
  }
  const tooth = parseTooth(given, notation, `${at}.tooth`)
  checkRegion(template, tooth, notation, `${at}.tooth`)
  const seen = new Set([tooth.iso])
  const extraTeeth = (input.teeth ?? []).map((text, j) => {
    const field = `${at}.teeth.${j}`
    const extra = parseTooth(text, notation, field)
    if (seen.has(extra.iso)) fail(field, `${toothLabel(extra, notation)} is already in this item`)
    seen.add(extra.iso)
    checkRegion(template, extra, notation, field)
    return extra
  })
  return { tooth, extraTeeth }
}

function resolveSurfaces(input: PlanItemInput, tooth: Tooth | undefined, notation: ToothNotation, at: string) {
  const text = input.surfaces?.trim() ? input.surfaces : undefined
  if (!text) {
    if (templateNeedsSurfaces(input.template)) fail(`${at}.surfaces`, `${input.template.name} needs surfaces`)
    return { surfaces: [], notes: [] }
  }
  if (!tooth) fail(`${at}.surfaces`, 'Surfaces need a tooth')
  return parseSurfaces(text, tooth, { field: `${at}.surfaces`, notation })
}

function wantsAnaesthesia(input: PlanItemInput): boolean {
  return input.anaesthesia === undefined ? input.template.anaesthesia.required : input.anaesthesia !== 'none'
}

function anaesthesiaNeedsFor(input: PlanItemInput, teeth: Tooth[], at: string): QuadrantNeed[] {
  if (!wantsAnaesthesia(input)) return []
  if (teeth.length === 0) fail(`${at}.anaesthesia`, 'Anaesthesia needs a tooth to know which quadrant to numb')
  const needs = new Map<Quadrant, QuadrantNeed>()
  for (const tooth of teeth) {
    if (needs.has(tooth.quadrant)) continue
    const archSettings = input.template.anaesthesia[tooth.arch]
    const technique = input.anaesthesia === 'infiltration' || input.anaesthesia === 'block' ? input.anaesthesia : archSettings.technique
    needs.set(tooth.quadrant, { quadrant: tooth.quadrant, arch: tooth.arch, technique, ...archSettings[technique] })
  }
  return [...needs.values()]
}

function stepMinutes(step: TemplateStep, surfaceCount: number, extraTeethCount: number): number {
  const extraSurfaces = Math.max(0, surfaceCount - 1)
  return step.baseMinutes + step.perExtraSurfaceMinutes * extraSurfaces + step.perExtraToothMinutes * extraTeethCount
}

function timeSteps(template: ChairTimeTemplate, surfaceCount: number, extraTeethCount: number): Record<StepRole, TimedStep[]> {
  const byRole: Record<StepRole, TimedStep[]> = { seat: [], treat: [], dismiss: [], turnover: [] }
  for (const step of template.steps) {
    const minutes = stepMinutes(step, surfaceCount, extraTeethCount)
    // Zero-minute steps are dropped so the timeline has no empty bands.
    if (minutes > 0) byRole[stepRole(step)].push({ label: step.label, kind: step.kind, minutes })
  }
  return byRole
}

function resolveItem(input: PlanItemInput, index: number): ResolvedItem {
  const at = `items.${index}`
  checkTemplate(input.template, at)
  const notation = input.notation ?? 'universal'
  const { tooth, extraTeeth } = resolveTeeth(input, notation, at)
  const { surfaces, notes } = resolveSurfaces(input, tooth, notation, at)
  const blackClass = tooth && surfaces.length > 0
    ? underField(`${at}.lesion`, () => classifyCavity(tooth, surfaces, input.lesion).blackClass)
    : null
  const teeth = tooth ? [tooth, ...extraTeeth] : []
  return {
    index,
    template: input.template,
    notation,
    tooth,
    extraTeeth,
    surfaces,
    surfaceNotes: notes,
    blackClass,
    anaesthesiaNeeds: anaesthesiaNeedsFor(input, teeth, at),
    stepsByRole: timeSteps(input.template, surfaces.length, extraTeeth.length),
  }
}

// ---------------------------------------------------------------- anaesthesia per quadrant

// When items in one quadrant differ, a block wins (it numbs more than an infiltration), and
// within a technique the longer times win, so no item starts before its own onset has passed.
function mergeNeed(current: QuadrantNeed, next: QuadrantNeed): QuadrantNeed {
  if (current.technique !== next.technique) return current.technique === 'block' ? current : next
  return {
    ...current,
    injectMinutes: Math.max(current.injectMinutes, next.injectMinutes),
    onsetMinutes: Math.max(current.onsetMinutes, next.onsetMinutes),
  }
}

function quadrantNeeds(items: readonly ResolvedItem[]): QuadrantNeed[] {
  const byQuadrant = new Map<Quadrant, QuadrantNeed>()
  for (const need of items.flatMap((item) => item.anaesthesiaNeeds)) {
    const current = byQuadrant.get(need.quadrant)
    byQuadrant.set(need.quadrant, current ? mergeNeed(current, need) : need)
  }
  return [...byQuadrant.values()]
}

function permutations<T>(list: readonly T[]): T[][] {
  if (list.length <= 1) return [[...list]]
  return list.flatMap((head, i) => permutations([...list.slice(0, i), ...list.slice(i + 1)]).map((rest) => [head, ...rest]))
}

// ---------------------------------------------------------------- timeline

class Timeline {
  readonly segments: PlanSegment[] = []
  now = 0

  add(kind: StepKind, label: string, minutes: number, extra: Pick<PlanSegment, 'itemIndex' | 'quadrant'> = {}): void {
    if (minutes <= 0) return
    this.segments.push({ kind, label, startMinute: this.now, endMinute: this.now + minutes, ...extra })
    this.now += minutes
  }

  addSteps(steps: readonly TimedStep[], itemIndex?: number): void {
    for (const step of steps) this.add(step.kind, step.label, step.minutes, itemIndex === undefined ? {} : { itemIndex })
  }
}

function techniqueText(need: QuadrantNeed): string {
  return `${quadrantLabel(need.quadrant)} (${need.technique})`
}

// The visit's seating (or dismissal, or reset) is the longest one among its items.
function longestPhase(items: readonly ResolvedItem[], role: Exclude<StepRole, 'treat'>): TimedStep[] {
  let best: TimedStep[] = []
  let bestMinutes = -1
  for (const item of items) {
    const minutes = sumMinutes(item.stepsByRole[role])
    if (minutes > bestMinutes) {
      best = item.stepsByRole[role]
      bestMinutes = minutes
    }
  }
  return best
}

function sumMinutes(steps: readonly { minutes: number }[]): number {
  return steps.reduce((total, step) => total + step.minutes, 0)
}

interface TreatmentSchedule {
  timeline: Timeline
  anaesthesia: PlannedAnaesthesia[]
}

function readyTime(item: ResolvedItem, planned: readonly PlannedAnaesthesia[]): { at: number; quadrant?: PlannedAnaesthesia } {
  let latest: PlannedAnaesthesia | undefined
  for (const need of item.anaesthesiaNeeds) {
    const plan = planned.find((p) => p.quadrant === need.quadrant)
    if (plan && (!latest || plan.readyAt > latest.readyAt)) latest = plan
  }
  return { at: latest?.readyAt ?? 0, quadrant: latest }
}

function scheduleTreatment(items: readonly ResolvedItem[], injectionOrder: readonly QuadrantNeed[], seat: TimedStep[]): TreatmentSchedule {
  const timeline = new Timeline()
  timeline.addSteps(seat)
  const anaesthesia: PlannedAnaesthesia[] = injectionOrder.map((need) => {
    const injectAt = timeline.now
    timeline.add('hands_on', `Local anaesthetic, ${techniqueText(need)}`, need.injectMinutes, { quadrant: need.quadrant })
    return { ...need, injectAt, readyAt: injectAt + need.injectMinutes + need.onsetMinutes }
  })
  // Stable sort: items needing no anaesthesia have ready time 0 and so fill the onset wait.
  const byReadiness = [...items].sort((a, b) => readyTime(a, anaesthesia).at - readyTime(b, anaesthesia).at)
  for (const item of byReadiness) {
    const ready = readyTime(item, anaesthesia)
    if (ready.quadrant && ready.at > timeline.now) {
      timeline.add('numbing', `Onset wait, ${techniqueText(ready.quadrant)}`, ready.at - timeline.now, { quadrant: ready.quadrant.quadrant })
    }
    timeline.addSteps(item.stepsByRole.treat, item.index)
  }
  return { timeline, anaesthesia }
}

function bestSchedule(items: readonly ResolvedItem[], seat: TimedStep[]): TreatmentSchedule {
  let best: TreatmentSchedule | undefined
  for (const order of permutations(quadrantNeeds(items))) {
    const candidate = scheduleTreatment(items, order, seat)
    if (!best || candidate.timeline.now < best.timeline.now) best = candidate
  }
  // permutations() always yields at least the empty order.
  return best ?? scheduleTreatment(items, [], seat)
}

function roundUp(minutes: number, unit: number): number {
  return Math.ceil(minutes / unit) * unit
}

// ---------------------------------------------------------------- summaries and explanation

function itemTitle(item: ResolvedItem): string {
  if (!item.tooth) return `${item.template.name},`
  const teeth = [item.tooth, ...item.extraTeeth].map((tooth) => formatTooth(tooth, item.notation))
  const surfaces = item.surfaces.length > 0 ? ` ${item.surfaces.join('')}` : ''
  const where = teeth.length > 1 ? `teeth ${teeth.slice(0, -1).join(', ')} and ${teeth.at(-1)}` : `tooth ${teeth.join('')}`
  return `${item.template.name}, ${where}${surfaces},`
}

function itemAnaesthesia(item: ResolvedItem): AnaesthesiaChoice {
  return item.anaesthesiaNeeds[0]?.technique ?? 'none'
}

function summarise(item: ResolvedItem): PlanItemSummary {
  const toPlanned = (tooth: Tooth) => ({ iso: tooth.iso, universal: tooth.universal })
  return {
    templateCode: item.template.code,
    templateName: item.template.name,
    ...(item.template.version === undefined ? {} : { templateVersion: item.template.version }),
    ...(item.tooth ? { tooth: toPlanned(item.tooth) } : {}),
    extraTeeth: item.extraTeeth.map(toPlanned),
    surfaces: item.surfaces,
    surfaceNotes: item.surfaceNotes,
    blackClass: item.blackClass,
    anaesthesia: itemAnaesthesia(item),
    treatMinutes: sumMinutes(item.stepsByRole.treat),
  }
}

interface ExplanationParts {
  seat: number
  anaesthesia: readonly PlannedAnaesthesia[]
  segments: readonly PlanSegment[]
  items: readonly ResolvedItem[]
  dismiss: number
  turnover: number
}

function treatmentPhrases(parts: ExplanationParts): string[] {
  const phrases: string[] = []
  let lastItem: number | undefined
  for (const segment of parts.segments) {
    const minutes = segment.endMinute - segment.startMinute
    if (segment.kind === 'numbing') {
      const where = segment.quadrant ? `the ${quadrantLabel(segment.quadrant)}` : 'anaesthesia'
      phrases.push(`wait ${minutes} min for ${where} to go numb`)
      lastItem = undefined
    } else if (segment.itemIndex !== undefined) {
      const item = parts.items[segment.itemIndex]
      if (!item) continue
      if (segment.itemIndex !== lastItem) phrases.push(`${itemTitle(item)} ${sumMinutes(item.stepsByRole.treat)} min`)
      lastItem = segment.itemIndex
    }
  }
  return phrases
}

function explain(parts: ExplanationParts, plan: Omit<VisitPlan, 'explanation' | 'items' | 'segments' | 'anaesthesia'>): string {
  const phrases: string[] = []
  if (parts.seat > 0) phrases.push(`seating ${parts.seat} min`)
  for (const shot of parts.anaesthesia) {
    phrases.push(`anaesthetic for the ${techniqueText(shot)} ${shot.injectMinutes} min then ${shot.onsetMinutes} min onset`)
  }
  phrases.push(...treatmentPhrases(parts))
  if (parts.dismiss > 0) phrases.push(`dismissal ${parts.dismiss} min`)
  if (parts.turnover > 0) phrases.push(`room reset ${parts.turnover} min`)
  const spare = plan.chairMinutes - plan.rawMinutes
  if (spare > 0) phrases.push(`${spare} min added to round up to the ${plan.unitMinutes}-minute booking step`)
  const sentence = phrases.join('; ')
  const totals = `Chair ${plan.chairMinutes} min, provider ${plan.providerMinutes} min, assistant ${plan.assistantMinutes} min, numbing wait ${plan.numbingMinutes} min.`
  return `${sentence.charAt(0).toUpperCase()}${sentence.slice(1)}. ${totals}`
}

function minutesOfKind(segments: readonly PlanSegment[], kind: StepKind): number {
  return segments.filter((s) => s.kind === kind).reduce((total, s) => total + s.endMinute - s.startMinute, 0)
}

function checkOptions(options: PlanOptions): void {
  if (!BOOKING_UNITS.includes(options.unitMinutes)) fail('unitMinutes', `The booking unit must be ${BOOKING_UNITS.join(', ')} minutes`)
}

// ---------------------------------------------------------------- entry point

/** Merges plan items into one visit timeline; throws DomainValidationError with an `items.N.…` field. */
export function planVisit(items: PlanItemInput[], options: PlanOptions): VisitPlan {
  checkOptions(options)
  if (items.length === 0) fail('items', 'A visit needs at least one procedure')
  const resolved = items.map((item, index) => resolveItem(item, index))

  const seat = longestPhase(resolved, 'seat')
  const dismiss = longestPhase(resolved, 'dismiss')
  const turnover = longestPhase(resolved, 'turnover')
  const { timeline, anaesthesia } = bestSchedule(resolved, seat)
  timeline.addSteps(dismiss)
  timeline.addSteps(turnover)

  const rawMinutes = timeline.now
  const chairMinutes = roundUp(rawMinutes, options.unitMinutes)
  timeline.add('reset', `Rounded up to the ${options.unitMinutes}-minute booking step`, chairMinutes - rawMinutes)
  if (chairMinutes > MAX_VISIT_MINUTES) {
    fail('items', `These procedures need ${chairMinutes} minutes in the chair; one visit is at most ${MAX_VISIT_MINUTES} minutes (8 hours), so book them as two visits`)
  }

  const totals = {
    chairMinutes,
    rawMinutes,
    providerMinutes: minutesOfKind(timeline.segments, 'hands_on'),
    assistantMinutes: minutesOfKind(timeline.segments, 'assist'),
    numbingMinutes: minutesOfKind(timeline.segments, 'numbing'),
    unitMinutes: options.unitMinutes,
  }
  const explanation = explain(
    { seat: sumMinutes(seat), anaesthesia, segments: timeline.segments, items: resolved, dismiss: sumMinutes(dismiss), turnover: sumMinutes(turnover) },
    totals,
  )
  return { segments: timeline.segments, ...totals, anaesthesia, explanation, items: resolved.map(summarise) }
}
