// How visits of a site turned out over a range (issue 14, Balance): the share of patients who did
// not come, and the share of visits cancelled late. Pure; times are epoch milliseconds.
//
// Definitions (our own; common practice, no source):
// - A visit counts for the range when its start lies inside it.
// - No-show (missed) rate: visits marked `missed` ("Did not come") among the visits that were due,
//   i.e. started before now and were not cancelled. Visits still ahead are not counted.
// - Late-cancellation rate: visits cancelled less than LATE_CANCEL_HOURS before their start (or after
//   it) among all visits of the range, cancelled or not.
import type { VisitState } from './visit-states'

/** A cancellation this close to the start (or later) is late. A constant, documented in DEVELOPERS.md. */
export const LATE_CANCEL_HOURS = 24

export interface VisitOutcome {
  state: VisitState
  startMs: number
  /** When it was cancelled (from the audit log); null when it was not. */
  cancelledAtMs: number | null
}

export interface OutcomeRates {
  /** Visits starting inside the range. */
  visits: number
  /** Visits that were due (started before now, not cancelled). */
  due: number
  missed: number
  /** missed / due, or null when none were due. */
  missedRate: number | null
  cancelled: number
  lateCancelled: number
  /** lateCancelled / visits, or null without visits. */
  lateCancelRate: number | null
}

export function isLateCancel(outcome: VisitOutcome, lateHours = LATE_CANCEL_HOURS): boolean {
  return outcome.state === 'cancelled' && outcome.cancelledAtMs !== null
    && outcome.cancelledAtMs > outcome.startMs - lateHours * 3_600_000
}

export function outcomeRates(outcomes: readonly VisitOutcome[], nowMs: number, lateHours = LATE_CANCEL_HOURS): OutcomeRates {
  const cancelled = outcomes.filter((outcome) => outcome.state === 'cancelled')
  const due = outcomes.filter((outcome) => outcome.state !== 'cancelled' && outcome.startMs <= nowMs)
  const missed = due.filter((outcome) => outcome.state === 'missed').length
  const lateCancelled = cancelled.filter((outcome) => isLateCancel(outcome, lateHours)).length
  return {
    visits: outcomes.length,
    due: due.length,
    missed,
    missedRate: due.length ? missed / due.length : null,
    cancelled: cancelled.length,
    lateCancelled,
    lateCancelRate: outcomes.length ? lateCancelled / outcomes.length : null,
  }
}
