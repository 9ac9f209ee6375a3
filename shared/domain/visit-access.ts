// Who may do what to one visit, and whether now: the one decision the server enforces and the
// screens use to offer only what will work. Pure: the caller passes the clock.
import type { Role } from '../types/auth'
import { ROLE_GROUPS } from '../utils/access'
import { canMove, canMoveToState, stateTimeProblem, VISIT_STATE_LABELS, type VisitState, type VisitTiming } from './visit-states'

export interface VisitActor {
  role: Role
  allSites: boolean
  siteIds: readonly number[]
  /** The provider record of the signed-in user (dentists and hygienists), or null. */
  providerId: number | null
}

export interface VisitFacts extends VisitTiming {
  siteId: number
  providerId: number
}

export type Verdict =
  | { allowed: true }
  | { allowed: false; status: 403 | 409; reason: string }

export const NOT_YOUR_VISIT = 'Only the front desk, managers and admins of this site, or the visit\'s own provider, may change this visit\'s state.'
export const DESK_ONLY = 'Only the front desk, managers and admins of this site may move, change the length of or cancel a visit.'

const ALLOWED: Verdict = { allowed: true }
const refused = (status: 403 | 409, reason: string): Verdict => ({ allowed: false, status, reason })

function coversSite(actor: VisitActor, siteId: number): boolean {
  return actor.allSites || actor.siteIds.includes(siteId)
}

/** Front desk, managers and admins of the visit's site. */
export function isDeskOf(actor: VisitActor, siteId: number): boolean {
  return (ROLE_GROUPS.booking as readonly Role[]).includes(actor.role) && coversSite(actor, siteId)
}

/** The visit's own provider (a dentist or hygienist signed in as that provider). */
export function isOwnProvider(actor: VisitActor, visit: Pick<VisitFacts, 'providerId'>): boolean {
  return actor.providerId !== null && actor.providerId === visit.providerId
}

/** May `actor` move `visit` to `to` now? 403 for who, 409 for the state or the time (in words). */
export function mayChangeState(actor: VisitActor, visit: VisitFacts, to: VisitState, nowMs: number): Verdict {
  if (to === 'cancelled') {
    const rebook = mayRebook(actor, visit)
    if (!rebook.allowed) return rebook
  } else if (!isDeskOf(actor, visit.siteId) && !isOwnProvider(actor, visit)) {
    return refused(403, NOT_YOUR_VISIT)
  }
  if (!canMoveToState(visit.state, to)) return refused(409, `A visit that is ${VISIT_STATE_LABELS[visit.state].toLowerCase()} cannot become ${VISIT_STATE_LABELS[to].toLowerCase()}.`)
  const problem = stateTimeProblem(visit, to, nowMs)
  return problem ? refused(409, problem) : ALLOWED
}

/** Moving, re-planning, changing the length and cancelling: the desk's work, on a visit that still holds its time. */
export function mayRebook(actor: VisitActor, visit: Pick<VisitFacts, 'siteId' | 'state'>): Verdict {
  if (!isDeskOf(actor, visit.siteId)) return refused(403, DESK_ONLY)
  if (!canMove(visit.state)) return refused(409, `A ${VISIT_STATE_LABELS[visit.state].toLowerCase()} visit cannot be moved, changed or cancelled.`)
  return ALLOWED
}

export interface StateOffer {
  to: VisitState
  verdict: Verdict
}

/**
 * What a screen offers for one visit: the state moves the actor may make (refused by role: left out;
 * refused by time: shown disabled with the reason), whether move and length are offered (`rebook`) and
 * whether cancelling is (`cancel`).
 */
export function visitOffers(
  actor: VisitActor, visit: VisitFacts, nowMs: number, moves: readonly VisitState[],
): { states: StateOffer[]; rebook: Verdict; cancel: Verdict } {
  const states = moves
    .filter((to) => to !== 'cancelled' && canMoveToState(visit.state, to))
    .map((to) => ({ to, verdict: mayChangeState(actor, visit, to, nowMs) }))
    .filter((offer) => offer.verdict.allowed || offer.verdict.status === 409)
  // A visit in treatment may still be moved or given another length, but no longer cancelled.
  return { states, rebook: mayRebook(actor, visit), cancel: mayChangeState(actor, visit, 'cancelled', nowMs) }
}

export const ANAESTHETIC_WHO = 'Only the visit\'s own provider, the assistants of this site, and its managers and admins may record the anaesthetic.'

/**
 * Who records "anaesthetic given" (issue 13 §4): the visit's own provider, an assistant of the site,
 * or a manager or admin of the site. The front desk does not: it is a chairside fact.
 */
export function mayRecordAnaesthetic(actor: VisitActor, visit: Pick<VisitFacts, 'siteId' | 'providerId'>): Verdict {
  if (isOwnProvider(actor, visit)) return ALLOWED
  const chairside: readonly Role[] = ['assistant', 'manager', 'admin']
  if (chairside.includes(actor.role) && coversSite(actor, visit.siteId)) return ALLOWED
  return refused(403, ANAESTHETIC_WHO)
}
