// Undoing a visit's last state change (issue 13 §3): which state it returns to, whether the caller may
// do it now, and its words. Pure: the caller passes the clock. Whether the chair, provider and patient
// are still free for a visit that gave its time back (did not come, cancelled) is checked by the
// booking transaction on the server.
import { localDateAt } from '../utils/local-date'
import { holdsTime, VISIT_STATE_LABELS, type VisitState } from './visit-states'
import { isDeskOf, isOwnProvider, NOT_YOUR_VISIT, type VisitActor, type Verdict } from './visit-access'

export interface UndoFacts {
  siteId: number
  providerId: number
  state: VisitState
  /** The state before the last change, or null when there is nothing to undo. */
  previousState: VisitState | null
  /** When the last change was made (UTC ISO), or null. */
  stateChangedAt: string | null
  timeZone: string
}

/** The state an undo returns to: the one before the last change, when there is one. */
export function undoTarget(visit: Pick<UndoFacts, 'state' | 'previousState'>): VisitState | null {
  if (visit.previousState === null || visit.previousState === visit.state) return null
  return visit.previousState
}

/** Whether undoing takes the chair and provider back (the visit had given its time away). */
export function undoRetakesTime(visit: Pick<UndoFacts, 'state' | 'previousState'>): boolean {
  const to = undoTarget(visit)
  return to !== null && !holdsTime(visit.state) && holdsTime(to)
}

/** "Undo arrived", "Undo did not come": the button's words for the last change. */
export function undoLabel(state: VisitState): string {
  return `Undo ${VISIT_STATE_LABELS[state].toLowerCase()}`
}

export const UNDO_DESK_ONLY = 'Only the front desk, managers and admins of this site may undo a cancellation.'

/**
 * May `actor` undo the visit's last state change now? The same roles as the change itself (a
 * cancellation: the desk; any other state: the desk or the visit's own provider), only on the site's
 * local day the change was made, and only the last change (an undo is not undone again).
 */
export function mayUndo(actor: VisitActor, visit: UndoFacts, nowMs: number): Verdict {
  const desk = isDeskOf(actor, visit.siteId)
  if (visit.state === 'cancelled' && !desk) return { allowed: false, status: 403, reason: UNDO_DESK_ONLY }
  if (!desk && !isOwnProvider(actor, visit)) return { allowed: false, status: 403, reason: NOT_YOUR_VISIT }
  const to = undoTarget(visit)
  if (to === null || visit.stateChangedAt === null) {
    return { allowed: false, status: 409, reason: 'There is no state change to undo on this visit.' }
  }
  const changedDay = localDateAt(Date.parse(visit.stateChangedAt), visit.timeZone)
  const today = localDateAt(nowMs, visit.timeZone)
  if (changedDay !== today) {
    return { allowed: false, status: 409, reason: `The visit became ${VISIT_STATE_LABELS[visit.state].toLowerCase()} on an earlier day: a change can be undone only on the day it was made.` }
  }
  return { allowed: true }
}
