// The patient's part of a visit: from seating to dismissal. The chair is held longer, for the room's
// reset after the patient leaves, but that is not the patient's time; e-mails, the calendar event and
// the visit page all show this span. Pure.
import type { VisitPlan } from '../types/chair-time'

/** Minutes from the start until the last segment that is not room turnover ('reset'). */
export function patientMinutesOf(plan: Pick<VisitPlan, 'segments'> | undefined, chairMinutes: number): number {
  const segments = plan?.segments ?? []
  let end = chairMinutes
  for (let index = segments.length - 1; index >= 0 && segments[index]!.kind === 'reset'; index -= 1) end = segments[index]!.startMinute
  return end > 0 ? end : chairMinutes
}

/** What a patient message shows of a visit. */
export interface SeenVisit {
  startMs: number
  minutes: number
  /** Procedure names (shown only where the site allows it, but a change in them is a change). */
  what: string[]
}

export interface SeenChange {
  time: boolean
  length: boolean
  what: boolean
}

/** What changed for the patient between two versions of a visit, or null when nothing they see did (a reset-only change). */
export function seenChange(before: SeenVisit, after: SeenVisit): SeenChange | null {
  const change = {
    time: before.startMs !== after.startMs,
    length: before.minutes !== after.minutes,
    what: before.what.join('\n') !== after.what.join('\n'),
  }
  return change.time || change.length || change.what ? change : null
}

export function seenVisitOf(plan: VisitPlan | undefined, startMs: number, endMs: number, includeWhat: boolean): SeenVisit {
  const names = includeWhat ? [...new Set((plan?.items ?? []).map((item) => item.templateName).filter(Boolean))] : []
  return { startMs, minutes: patientMinutesOf(plan, Math.round((endMs - startMs) / 60_000)), what: names }
}
