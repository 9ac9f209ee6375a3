// Default chair-time templates for a new practice. Every minute is a default a practice can change
// on the Templates screen. Sources are from /work/shared/check-values.md; values without a source
// say "common practice, no source" or "from memory".
import { DEFAULT_ANAESTHESIA } from '../../shared/domain/chair-time'
import type { AnaesthesiaSettings, ArchAnaesthesia, ChairTimeTemplate, StepKind, StepRole, TemplateStep } from '../../shared/types/chair-time'

function step(
  label: string,
  kind: StepKind,
  role: StepRole,
  baseMinutes: number,
  perExtraSurfaceMinutes = 0,
  perExtraToothMinutes = 0,
): TemplateStep {
  return { label, kind, role, baseMinutes, perExtraSurfaceMinutes, perExtraToothMinutes }
}

function copyArch(arch: ArchAnaesthesia): ArchAnaesthesia {
  return { technique: arch.technique, infiltration: { ...arch.infiltration }, block: { ...arch.block } }
}

// Each template gets its own copy so editing one never changes another.
function anaesthesia(required: boolean, overrides: Partial<Pick<AnaesthesiaSettings, 'maxillary' | 'mandibular'>> = {}): AnaesthesiaSettings {
  return {
    required,
    maxillary: copyArch(overrides.maxillary ?? DEFAULT_ANAESTHESIA.maxillary),
    mandibular: copyArch(overrides.mandibular ?? DEFAULT_ANAESTHESIA.mandibular),
  }
}

// Room turnover: CDC (MMWR 2003;52(RR-17); 2016 summary) requires cleaning and disinfecting
// contact surfaces and changing barriers between patients but gives no time; 10–15 min is
// common practice. 10 min by default, 15 after surgery.
const TURNOVER_MINUTES = 10
const SURGICAL_TURNOVER_MINUTES = 15

/**
 * Posterior composite, modelled on check-values.md "A posterior composite visit, step by step".
 * Booking lengths of about 30, 45 and 60 min for 1, 2 and 3 surfaces, onset and turnover not
 * included (common practice, no source): seat 5 + injection 2 + treatment 20 (+15 per extra
 * surface) + dismissal 3.
 */
const POSTERIOR_COMPOSITE: ChairTimeTemplate = {
  code: 'COMP-POST',
  name: 'Posterior composite',
  category: 'restorative',
  capability: 'restorative',
  needsTooth: true,
  needsSurfaces: true,
  region: 'posterior',
  version: 1,
  steps: [
    step('Seat, review, set up tray', 'assist', 'seat', 5),
    // Depth of at least about 1.5 mm (check-values.md, common practice); grows with surfaces.
    step('Isolate, prepare, remove caries', 'hands_on', 'treat', 8, 6, 6),
    step('Liner, etch, bond and cure', 'hands_on', 'treat', 3, 1, 2),
    // Increments of about 2 mm, each light-cured (J Conserv Dent 2017;20:386–391).
    step('Place and cure composite in increments, shape', 'hands_on', 'treat', 5, 5, 4),
    step('Finish, check bite, polish', 'hands_on', 'treat', 4, 3, 3),
    step('Dismiss patient', 'assist', 'dismiss', 3),
    step('Clean, disinfect, change barriers', 'reset', 'turnover', TURNOVER_MINUTES),
  ],
  anaesthesia: anaesthesia(true),
}

/** Same shape as the posterior composite; 30 min for one surface (common practice, no source). */
const ANTERIOR_COMPOSITE: ChairTimeTemplate = {
  code: 'COMP-ANT',
  name: 'Anterior composite',
  category: 'restorative',
  capability: 'restorative',
  needsTooth: true,
  needsSurfaces: true,
  region: 'anterior',
  version: 1,
  steps: [
    step('Seat, review, choose shade', 'assist', 'seat', 5),
    step('Isolate, prepare, remove caries', 'hands_on', 'treat', 6, 4, 5),
    step('Etch, bond and cure', 'hands_on', 'treat', 3, 1, 2),
    step('Layer and cure composite, shape', 'hands_on', 'treat', 6, 5, 5),
    step('Finish, check bite, polish', 'hands_on', 'treat', 5, 3, 3),
    step('Dismiss patient', 'assist', 'dismiss', 3),
    step('Clean, disinfect, change barriers', 'reset', 'turnover', TURNOVER_MINUTES),
  ],
  // Lower incisors are often numbed by infiltration rather than a block (from memory).
  anaesthesia: anaesthesia(true, {
    mandibular: { ...DEFAULT_ANAESTHESIA.mandibular, technique: 'infiltration' },
  }),
}

/** Pit-and-fissure sealant on one or more posterior teeth, no anaesthetic (common practice, no source). Seating and dismissal stay `assist`: dentists place sealants with an assistant, and a dentist may seal during another patient's onset wait. */
const SEALANT: ChairTimeTemplate = {
  code: 'SEAL',
  name: 'Sealant',
  category: 'preventive',
  capability: 'hygiene',
  needsTooth: true,
  needsSurfaces: false,
  region: 'posterior',
  version: 1,
  steps: [
    step('Seat and set up', 'assist', 'seat', 3),
    step('Clean, isolate and etch', 'hands_on', 'treat', 4, 0, 3),
    step('Apply and cure sealant', 'hands_on', 'treat', 3, 0, 2),
    step('Check bite', 'hands_on', 'treat', 2, 0, 1),
    step('Dismiss patient', 'assist', 'dismiss', 2),
    step('Clean, disinfect, change barriers', 'reset', 'turnover', TURNOVER_MINUTES),
  ],
  anaesthesia: anaesthesia(false),
}

/**
 * Adult cleaning by a hygienist, about 45 min plus turnover (from memory). The hygienist works it
 * alone, seating and dismissal included, so every step is hands_on: with seating typed `assist`, one
 * hygienist could be booked into a second room while still seating or dismissing in the first
 * (issue 13 §5). A practice whose assistant seats hygiene patients changes those steps to `assist`.
 */
const ADULT_CLEANING: ChairTimeTemplate = {
  code: 'CLEAN-ADULT',
  name: 'Adult cleaning',
  category: 'hygiene',
  capability: 'hygiene',
  needsTooth: false,
  needsSurfaces: false,
  version: 1,
  steps: [
    step('Seat, review health history', 'hands_on', 'seat', 4),
    step('Gum check and scaling', 'hands_on', 'treat', 25),
    step('Polish', 'hands_on', 'treat', 8),
    step('Floss and home-care advice', 'hands_on', 'treat', 5),
    step('Dismiss patient', 'hands_on', 'dismiss', 3),
    step('Clean, disinfect, change barriers', 'reset', 'turnover', TURNOVER_MINUTES),
  ],
  anaesthesia: anaesthesia(false),
}

/** Child cleaning with fluoride varnish, about 25 min plus turnover (from memory); worked by the hygienist alone, as the adult cleaning. */
const CHILD_CLEANING: ChairTimeTemplate = {
  code: 'CLEAN-CHILD',
  name: 'Child cleaning',
  category: 'hygiene',
  capability: 'pediatric',
  needsTooth: false,
  needsSurfaces: false,
  version: 1,
  steps: [
    step('Seat child and parent', 'hands_on', 'seat', 3),
    step('Clean and polish', 'hands_on', 'treat', 12),
    step('Fluoride varnish', 'hands_on', 'treat', 3),
    step('Brushing advice', 'hands_on', 'treat', 3),
    step('Dismiss patient', 'hands_on', 'dismiss', 2),
    step('Clean, disinfect, change barriers', 'reset', 'turnover', TURNOVER_MINUTES),
  ],
  anaesthesia: anaesthesia(false),
}

/** First visit with radiographs and a full exam, about an hour (from memory). */
const NEW_PATIENT_EXAM: ChairTimeTemplate = {
  code: 'EXAM-NEW',
  name: 'New-patient exam',
  category: 'exam',
  capability: 'imaging',
  needsTooth: false,
  needsSurfaces: false,
  version: 1,
  steps: [
    step('Seat, health history', 'assist', 'seat', 8),
    step('Radiographs', 'assist', 'treat', 10),
    step('Full exam and charting', 'hands_on', 'treat', 20),
    step('Discuss findings and plan', 'hands_on', 'treat', 10),
    step('Dismiss patient', 'assist', 'dismiss', 3),
    step('Clean, disinfect, change barriers', 'reset', 'turnover', TURNOVER_MINUTES),
  ],
  anaesthesia: anaesthesia(false),
}

/** Limited exam of one complaint; a tooth may be named but is not required (from memory). */
const EMERGENCY_EXAM: ChairTimeTemplate = {
  code: 'EXAM-EMER',
  name: 'Emergency exam',
  category: 'exam',
  capability: 'imaging',
  needsTooth: false,
  needsSurfaces: false,
  version: 1,
  steps: [
    step('Seat, note the complaint', 'assist', 'seat', 5),
    step('Radiograph of the area', 'assist', 'treat', 5),
    step('Limited exam and diagnosis', 'hands_on', 'treat', 10),
    step('Discuss options', 'hands_on', 'treat', 5),
    step('Dismiss patient', 'assist', 'dismiss', 2),
    step('Clean, disinfect, change barriers', 'reset', 'turnover', TURNOVER_MINUTES),
  ],
  anaesthesia: anaesthesia(false),
}

/** Crown preparation with impression and temporary crown, about 75–90 min (from memory). */
const CROWN_PREPARATION: ChairTimeTemplate = {
  code: 'CROWN-PREP',
  name: 'Crown preparation',
  category: 'prosthodontic',
  capability: 'restorative',
  needsTooth: true,
  needsSurfaces: false,
  version: 1,
  steps: [
    step('Seat, review, set up tray', 'assist', 'seat', 5),
    step('Shade and pre-op impression', 'hands_on', 'treat', 5, 0, 2),
    step('Prepare tooth', 'hands_on', 'treat', 30, 0, 25),
    step('Retraction and impression or scan', 'hands_on', 'treat', 15, 0, 5),
    step('Make temporary crown', 'assist', 'treat', 12, 0, 10),
    step('Cement temporary, check bite', 'hands_on', 'treat', 5, 0, 3),
    step('Dismiss patient', 'assist', 'dismiss', 3),
    step('Clean, disinfect, change barriers', 'reset', 'turnover', TURNOVER_MINUTES),
  ],
  anaesthesia: anaesthesia(true),
}

/** Simple (non-surgical) extraction of one or more teeth (from memory). */
const SIMPLE_EXTRACTION: ChairTimeTemplate = {
  code: 'EXT-SIMPLE',
  name: 'Simple extraction',
  category: 'surgical',
  capability: 'surgical',
  needsTooth: true,
  needsSurfaces: false,
  version: 1,
  steps: [
    step('Seat, review, consent', 'assist', 'seat', 5),
    step('Check anaesthesia, extract', 'hands_on', 'treat', 10, 0, 8),
    step('Haemostasis, stitches if needed', 'hands_on', 'treat', 5, 0, 3),
    step('Gauze bite and aftercare advice', 'assist', 'treat', 5),
    step('Dismiss patient', 'assist', 'dismiss', 3),
    step('Clean, disinfect, change barriers', 'reset', 'turnover', SURGICAL_TURNOVER_MINUTES),
  ],
  anaesthesia: anaesthesia(true),
}

export const DEFAULT_TEMPLATES: ChairTimeTemplate[] = [
  POSTERIOR_COMPOSITE,
  ANTERIOR_COMPOSITE,
  SEALANT,
  ADULT_CLEANING,
  CHILD_CLEANING,
  NEW_PATIENT_EXAM,
  EMERGENCY_EXAM,
  CROWN_PREPARATION,
  SIMPLE_EXTRACTION,
]
