// Recall (issue 17 §1): when a patient is next due for their regular cleaning or exam. Pure.
//
// A visit's recall kind comes from its templates' categories: a hygiene template makes it a cleaning,
// an exam template an exam (a visit may be both). Finishing the visit sets the next due date from the
// visit's local date plus the site's interval for that kind; booking a later visit with that kind marks
// the recall as booked. Intervals are site settings (`recallMonths`, default 6 months for a cleaning,
// 12 for an exam), and a patient may have their own interval for a kind (`PatientRecallMonths`, set on
// the patient page), which then wins; a patient is not e-mailed about a recall again within
// `recallMailMinDays` (default 14). The recall e-mail's link opens the recall page (`/recall/<token>`),
// which lists up to `RECALL_PAGE_OPENINGS` times for the kind's plan at the patient's preferred site.
import type { LocalDate } from '../types/rota'
import { addDays, addMonths } from '../utils/local-date'

export const RECALL_KINDS = ['cleaning', 'exam'] as const
export type RecallKind = (typeof RECALL_KINDS)[number]

export const RECALL_KIND_LABELS: Record<RecallKind, string> = { cleaning: 'Cleaning', exam: 'Exam' }

export interface RecallSettings {
  recallMonths: Record<RecallKind, number>
  recallMailMinDays: number
}

export const DEFAULT_RECALL_MONTHS: Record<RecallKind, number> = { cleaning: 6, exam: 12 }
export const DEFAULT_RECALL_MAIL_MIN_DAYS = 14
/** Bounds of a recall interval in whole months, site-wide or per patient. */
export const RECALL_MONTHS_MIN = 1
export const RECALL_MONTHS_MAX = 36

/** The caution shown wherever recall intervals (clinical values) appear. */
export const RECALL_CAUTION = 'Recall intervals are the practice\'s defaults or what was set for this patient; local regulations and the treating clinician decide how often a patient is seen.'

/** A patient's own interval per kind, in months; a kind left out follows the site's default. */
export type PatientRecallMonths = Partial<Record<RecallKind, number>>

/** The recall page: how many times it offers, how far ahead it looks, how long its link works. */
export const RECALL_PAGE_OPENINGS = 6
export const RECALL_PAGE_SEARCH_DAYS = 60
export const RECALL_LINK_DAYS = 30

/** The template category whose first active template is the plan for a recall of this kind. */
export const RECALL_TEMPLATE_CATEGORY: Record<RecallKind, 'hygiene' | 'exam'> = { cleaning: 'hygiene', exam: 'exam' }

function wholeBetween(value: unknown, min: number, max: number): number | null {
  return typeof value === 'number' && Number.isInteger(value) && value >= min && value <= max ? value : null
}

export function recallSettingsOf(settings: Record<string, unknown>): RecallSettings {
  const months = (settings.recallMonths ?? {}) as Record<string, unknown>
  return {
    recallMonths: {
      cleaning: wholeBetween(months.cleaning, RECALL_MONTHS_MIN, RECALL_MONTHS_MAX) ?? DEFAULT_RECALL_MONTHS.cleaning,
      exam: wholeBetween(months.exam, RECALL_MONTHS_MIN, RECALL_MONTHS_MAX) ?? DEFAULT_RECALL_MONTHS.exam,
    },
    recallMailMinDays: wholeBetween(settings.recallMailMinDays, 0, 365) ?? DEFAULT_RECALL_MAIL_MIN_DAYS,
  }
}

/** The recall kinds a visit with these template categories counts as. */
export function recallKindsOf(categories: readonly string[]): RecallKind[] {
  const kinds: RecallKind[] = []
  if (categories.includes('hygiene')) kinds.push('cleaning')
  if (categories.includes('exam')) kinds.push('exam')
  return kinds
}

/** The interval that applies: the patient's own for this kind when set (and in bounds), else the site's. */
export function recallMonthsFor(kind: RecallKind, settings: RecallSettings, patientMonths: PatientRecallMonths = {}): number {
  return wholeBetween(patientMonths[kind], RECALL_MONTHS_MIN, RECALL_MONTHS_MAX) ?? settings.recallMonths[kind]
}

export function nextDueDate(visitDate: LocalDate, kind: RecallKind, settings: RecallSettings, patientMonths: PatientRecallMonths = {}): LocalDate {
  return addMonths(visitDate, recallMonthsFor(kind, settings, patientMonths))
}

/** May the patient be e-mailed about a recall now? Not again within the site's minimum interval. */
export function mayMailRecall(lastContactMs: number | null, nowMs: number, settings: RecallSettings): boolean {
  return lastContactMs === null || nowMs - lastContactMs >= settings.recallMailMinDays * 86_400_000
}

/** 'overdue' before today, 'due' up to `soonDays` ahead, else 'later'. */
export function recallStatus(dueDate: LocalDate, today: LocalDate, soonDays = 30): 'overdue' | 'due' | 'later' {
  if (dueDate < today) return 'overdue'
  return dueDate <= addDays(today, soonDays) ? 'due' : 'later'
}

/** The recall page's times are at least this far apart, so the patient has a real choice of day and hour. */
export const RECALL_PAGE_SPACING_MINUTES = 120

/** Earliest first, keeping a time only when it starts at least `spacingMinutes` after the last one kept. */
export function spreadOpenings<T extends { startUtc: string }>(openings: readonly T[], count: number, spacingMinutes: number): T[] {
  const sorted = [...openings].sort((a, b) => Date.parse(a.startUtc) - Date.parse(b.startUtc))
  const kept: T[] = []
  for (const opening of sorted) {
    if (kept.length >= count) break
    const last = kept.at(-1)
    if (!last || Date.parse(opening.startUtc) - Date.parse(last.startUtc) >= spacingMinutes * 60_000) kept.push(opening)
  }
  return kept
}
