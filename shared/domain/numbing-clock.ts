// The numbing clock (issue 13 §4; glossary "anaesthetic given"): the onset wait runs from the moment
// the injection is recorded, for the technique's onset minutes, never from the planned schedule.
// Before it is recorded a screen shows the planned onset in words, and nothing at all for a patient
// who has not arrived. Pure: the caller passes the clock.
import type { VisitPlan } from '../types/chair-time'
import type { VisitState } from './visit-states'

/** Shown beside every countdown and onset figure. */
export const ONSET_CAUTION = 'Onset times vary by patient, agent and technique; the treating clinician confirms anaesthesia before starting.'

export interface NumbingFacts {
  state: VisitState
  plan: Pick<VisitPlan, 'anaesthesia'>
  /** When the anaesthetic was given (UTC ISO), or null. */
  anaestheticGivenAt: string | null
}

export type NumbingStatus =
  /** Arrived or in treatment, anaesthetic not yet recorded: the planned onset in words. */
  | { kind: 'planned'; onsetMinutes: number }
  /** Given: counting down to `readyAtMs`. */
  | { kind: 'counting'; readyAtMs: number; msLeft: number }
  /** Given, and the onset minutes have passed. */
  | { kind: 'ready'; readyAtMs: number }

/** Whether the visit's plan has local anaesthetic (a numbing wait) at all. */
export function hasNumbing(visit: Pick<NumbingFacts, 'plan'>): boolean {
  return (visit.plan.anaesthesia ?? []).length > 0
}

/** The longest onset of the planned injections: the patient is ready when every quadrant is. */
export function plannedOnsetMinutes(visit: Pick<NumbingFacts, 'plan'>): number {
  return Math.max(0, ...(visit.plan.anaesthesia ?? []).map((entry) => entry.onsetMinutes))
}

/** Whether "anaesthetic given" may be recorded now: a visit with numbing whose patient is in the chair. */
export function mayGiveAnaesthetic(visit: Pick<NumbingFacts, 'plan' | 'state'>): boolean {
  return hasNumbing(visit) && (visit.state === 'arrived' || visit.state === 'treating')
}

/** What the visit's numbing clock shows at `nowMs`, or null for nothing (no numbing, not arrived, closed). */
export function numbingStatus(visit: NumbingFacts, nowMs: number): NumbingStatus | null {
  if (!mayGiveAnaesthetic(visit)) return null
  const onsetMinutes = plannedOnsetMinutes(visit)
  if (visit.anaestheticGivenAt === null) return { kind: 'planned', onsetMinutes }
  const readyAtMs = Date.parse(visit.anaestheticGivenAt) + onsetMinutes * 60_000
  return nowMs < readyAtMs ? { kind: 'counting', readyAtMs, msLeft: readyAtMs - nowMs } : { kind: 'ready', readyAtMs }
}

/** "numbing about 5 min after the injection": the planned onset in words, no running clock. */
export function plannedOnsetText(onsetMinutes: number): string {
  return `numbing about ${onsetMinutes} min after the injection`
}
