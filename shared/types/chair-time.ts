// Chair-time templates and visit plans, shared by client and server.
// The engine that turns templates into a visit timeline is shared/domain/chair-time.ts.
import type { FieldProblem } from './api-errors'
import type { Arch, BlackClass, LesionMarks, Quadrant, Surface, ToothNotation } from './teeth'

export const STEP_KINDS = ['hands_on', 'assist', 'numbing', 'reset'] as const
/**
 * hands_on: provider working at the chair. assist: assistant only (seating, set-up, dismissal).
 * numbing: anaesthetic onset wait, chair held, provider free. reset: room turnover, no provider.
 */
export type StepKind = (typeof STEP_KINDS)[number]

export const STEP_ROLES = ['seat', 'treat', 'dismiss', 'turnover'] as const
/**
 * Where a step belongs in a visit. The engine merges by role:
 * - seat: before anaesthesia, once per visit;
 * - treat: the procedure itself, once per plan item;
 * - dismiss: after all treatment, once per visit;
 * - turnover: room reset at the very end, once per visit.
 * For seat, dismiss and turnover the visit uses the steps of the item whose steps of that role
 * add up to the most minutes (ties: the earlier item), so one visit is seated and turned over once.
 * A step without a role is 'turnover' when its kind is 'reset', otherwise 'treat'.
 */
export type StepRole = (typeof STEP_ROLES)[number]

export interface TemplateStep {
  label: string
  /** Never 'numbing': onset waits come from the template's anaesthesia settings. */
  kind: StepKind
  baseMinutes: number
  /** Added for every surface beyond the first. */
  perExtraSurfaceMinutes: number
  /** Added for every tooth beyond the main one (PlanItemInput.teeth). */
  perExtraToothMinutes: number
  role?: StepRole
}

export const ANAESTHESIA_TECHNIQUES = ['infiltration', 'block'] as const
export type AnaesthesiaTechnique = (typeof ANAESTHESIA_TECHNIQUES)[number]

export interface AnaesthesiaTiming {
  /** Provider time to give the injection (hands_on). */
  injectMinutes: number
  /** Minutes from the injection until work can begin (numbing unless other work fills it). */
  onsetMinutes: number
}

export interface ArchAnaesthesia {
  /** Technique used when the plan item does not choose one. */
  technique: AnaesthesiaTechnique
  /** Timing for each technique, so a per-item override on this arch also has its numbers. */
  infiltration: AnaesthesiaTiming
  block: AnaesthesiaTiming
}

/** Every value is a practice default; the clinician decides. */
export interface AnaesthesiaSettings {
  /** Whether the procedure normally needs local anaesthetic. A plan item can say 'none' or force a technique. */
  required: boolean
  maxillary: ArchAnaesthesia
  mandibular: ArchAnaesthesia
}

export const TEMPLATE_CATEGORIES = ['restorative', 'hygiene', 'exam', 'surgical', 'preventive', 'prosthodontic'] as const
export type TemplateCategory = (typeof TEMPLATE_CATEGORIES)[number]

/** What an operatory must be equipped for. */
export const OPERATORY_CAPABILITIES = ['restorative', 'hygiene', 'surgical', 'pediatric', 'imaging'] as const
export type OperatoryCapability = (typeof OPERATORY_CAPABILITIES)[number]

export interface ChairTimeTemplate {
  id?: number
  /** Short code of our own, such as 'COMP-POST'. */
  code: string
  name: string
  category: TemplateCategory
  capability: OperatoryCapability
  /**
   * A plan item must name a tooth (restorations, extractions). Exams and cleanings do not.
   * When absent: true for restorative, preventive, surgical and prosthodontic templates,
   * false for hygiene and exam (see templateNeedsTooth).
   */
  needsTooth?: boolean
  /** A plan item must give surfaces (fillings). Implies needsTooth. When absent: true for restorative only. */
  needsSurfaces?: boolean
  /** When set, every tooth of a plan item must be in this region (a posterior composite on a molar). */
  region?: 'anterior' | 'posterior'
  steps: TemplateStep[]
  anaesthesia: AnaesthesiaSettings
  version?: number
}

export type AnaesthesiaChoice = 'none' | AnaesthesiaTechnique

export interface PlanItemInput {
  template: ChairTimeTemplate
  /** Main tooth, in `notation`. */
  tooth?: string
  /** Notation of `tooth` and `teeth`; Universal when not given. */
  notation?: ToothNotation
  /** Surfaces of the main tooth, e.g. 'MOD'. */
  surfaces?: string
  /** Further teeth treated in the same item (sealants on several molars, adjacent extractions). */
  teeth?: string[]
  /** Overrides the template: 'none' skips anaesthesia, a technique forces it with that technique. */
  anaesthesia?: AnaesthesiaChoice
  /** Marks on the main tooth's lesion, for Black's class. */
  lesion?: LesionMarks
}

export type BookingUnitMinutes = 5 | 10 | 15

export interface PlanOptions {
  unitMinutes: BookingUnitMinutes
}

export interface PlanSegment {
  kind: StepKind
  label: string
  startMinute: number
  endMinute: number
  /** Index into VisitPlan.items for treatment steps. */
  itemIndex?: number
  /** Quadrant for anaesthetic injections and the waits for them. */
  quadrant?: Quadrant
}

export interface PlannedAnaesthesia {
  quadrant: Quadrant
  arch: Arch
  technique: AnaesthesiaTechnique
  injectMinutes: number
  onsetMinutes: number
  /** Minute the injection starts and the minute work in this quadrant may begin. */
  injectAt: number
  readyAt: number
}

export interface PlannedTooth {
  iso: string
  universal: string
}

export interface PlanItemSummary {
  templateCode: string
  templateName: string
  templateVersion?: number
  tooth?: PlannedTooth
  extraTeeth: PlannedTooth[]
  surfaces: Surface[]
  surfaceNotes: string[]
  blackClass: BlackClass | null
  anaesthesia: AnaesthesiaChoice
  treatMinutes: number
}

export interface VisitPlan {
  /** Contiguous from minute 0 to chairMinutes. */
  segments: PlanSegment[]
  /** rawMinutes rounded up to the booking unit; a final 'reset' segment holds the spare minutes. */
  chairMinutes: number
  rawMinutes: number
  /** hands_on minutes only. */
  providerMinutes: number
  /** assist minutes only; the assistant is also chairside during hands_on, which is not counted again. */
  assistantMinutes: number
  /** Chair held waiting for onset with nothing else to do: the provider may work elsewhere. */
  numbingMinutes: number
  unitMinutes: BookingUnitMinutes
  anaesthesia: PlannedAnaesthesia[]
  explanation: string
  items: PlanItemSummary[]
  /** Set when the front desk changed the length by hand (with the reason they gave). */
  lengthOverride?: { chairMinutes: number; reason: string }
}

/** A template problem is a 400's field problem. */
export type TemplateIssue = FieldProblem
