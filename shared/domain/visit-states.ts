// Visit states (glossary) and the moves between them the front desk and providers may make.
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

export const VISIT_STATE_LABELS: Record<VisitState, string> = {
  booked: 'Booked',
  confirmed: 'Confirmed',
  arrived: 'Arrived',
  treating: 'In treatment',
  finished: 'Finished',
  missed: 'Did not come',
  cancelled: 'Cancelled',
}
