// Visit states (glossary) and the moves between them the front desk and providers may make.
import type { DisplayStyle } from '../types/display'
import { formatDate, formatTime } from '../utils/display-time'
import { localDateAt } from '../utils/local-date'

export const VISIT_STATES = ['booked', 'confirmed', 'arrived', 'treating', 'finished', 'missed', 'cancelled'] as const
export type VisitState = (typeof VISIT_STATES)[number]

const NEXT_STATES: Record<VisitState, readonly VisitState[]> = {
  booked: ['confirmed', 'arrived', 'missed', 'cancelled'],
  confirmed: ['arrived', 'missed', 'cancelled', 'booked'],
  arrived: ['treating', 'missed', 'cancelled'],
  treating: ['finished'],
  finished: [],
  missed: [],
  cancelled: [],
}

export function allowedNextStates(from: VisitState): readonly VisitState[] {
  return NEXT_STATES[from]
}

export function canMoveToState(from: VisitState, to: VisitState): boolean {
  return NEXT_STATES[from].includes(to)
}

/** Visits that still hold their chair and provider. */
export function holdsTime(state: VisitState): boolean {
  return state !== 'cancelled' && state !== 'missed'
}

/** Closed: nothing more happens to the visit (finished, did not come, cancelled). */
export function isClosed(state: VisitState): boolean {
  return state === 'finished' || !holdsTime(state)
}

/**
 * Whether a visit in this state may still be moved, re-planned or given another length: every open
 * visit, including one in treatment (its chair time may run over). Who may do it is
 * `mayRebook` in visit-access.ts, which builds on this.
 */
export function canMove(state: VisitState): boolean {
  return !isClosed(state)
}

export const VISIT_STATE_LABELS: Record<VisitState, string> = {
  booked: 'Booked',
  confirmed: 'Confirmed',
  arrived: 'Arrived',
  treating: 'In treatment',
  finished: 'Finished',
  missed: 'Did not come',
  cancelled: 'Cancelled',
}

// ─── When a state may be set: it follows the visit's time, on the site's local calendar ───

/** Minutes before its start from which a visit may be marked arrived. */
export const ARRIVE_EARLY_MINUTES = 60

/** A visit's state and start, with its site's display style: "its day" is the visit's local date in `timeZone`, and refusals read on the site's clock and date order. */
export interface VisitTiming extends DisplayStyle {
  state: VisitState
  startUtc: string
}

/**
 * Why `to` may not be set now, in words, or null when time allows it. Pure: `nowMs` is the booking
 * clock on the server and the browser's clock on screens.
 * - arrived: on the visit's local day, from 60 minutes before its start;
 * - missed (did not come): only after its start;
 * - treating: only on its day;
 * - finished: on its day or later (a visit left in treatment can be closed the next morning; it
 *   cannot be finished before its day).
 * Other states (confirmed, back to booked, cancelled) have no time rule.
 */
export function stateTimeProblem(visit: VisitTiming, to: VisitState, nowMs: number): string | null {
  const startMs = Date.parse(visit.startUtc)
  const visitDay = localDateAt(startMs, visit.timeZone)
  const today = localDateAt(nowMs, visit.timeZone)
  const dayText = formatDate(startMs, visit)
  const startText = formatTime(startMs, visit)
  const label = VISIT_STATE_LABELS[to].toLowerCase()
  switch (to) {
    case 'arrived': {
      if (today !== visitDay) return `${dayText} is not today: a visit can be marked arrived only on its day.`
      const from = startMs - ARRIVE_EARLY_MINUTES * 60_000
      if (nowMs < from) {
        return `The visit starts at ${startText}: it can be marked arrived from ${formatTime(from, visit)}, ${ARRIVE_EARLY_MINUTES} minutes before.`
      }
      return null
    }
    case 'missed':
      if (nowMs < startMs) return `The visit starts ${dayText} at ${startText}: it can be marked did not come only after its start.`
      return null
    case 'treating':
      if (today !== visitDay) return `${dayText} is not today: a visit can be marked ${label} only on its day.`
      return null
    case 'finished':
      if (today < visitDay) return `${dayText} is not today: a visit can be marked finished only on its day (or later, to close a visit left in treatment).`
      return null
    default:
      return null
  }
}
