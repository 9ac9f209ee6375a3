// A visit's length changed by hand (the patient needs extra time, the room needs a longer reset).
// The work itself is never squeezed: only the room reset at the end grows or shrinks.
import type { VisitPlan } from '../types/chair-time'
import { DomainValidationError } from './errors'
import { MAX_VISIT_MINUTES } from './input-bounds'

const FIELD = 'lengthOverride.chairMinutes'

/** Minutes until the last step that is not the room reset ends. */
export function minimumChairMinutes(plan: VisitPlan): number {
  const work = plan.segments.filter((segment) => segment.kind !== 'reset')
  return work.length ? Math.max(...work.map((segment) => segment.endMinute)) : 0
}

export function withChairMinutes(plan: VisitPlan, chairMinutes: number, reason: string): VisitPlan {
  if (!Number.isInteger(chairMinutes) || chairMinutes <= 0) throw new DomainValidationError(FIELD, 'must be a whole number of minutes')
  if (chairMinutes > MAX_VISIT_MINUTES) throw new DomainValidationError(FIELD, `must be at most ${MAX_VISIT_MINUTES} minutes (8 hours), the longest visit`)
  if (chairMinutes % plan.unitMinutes !== 0) throw new DomainValidationError(FIELD, `must be a multiple of the site's ${plan.unitMinutes}-minute unit`)
  const floor = minimumChairMinutes(plan)
  if (chairMinutes < floor) throw new DomainValidationError(FIELD, `must be at least ${floor} minutes: the procedures themselves take that long`)
  const kept = plan.segments.filter((segment) => segment.endMinute <= floor)
  const reset = chairMinutes > floor
    ? [{ kind: 'reset' as const, label: `Room reset (length set by hand: ${reason})`, startMinute: floor, endMinute: chairMinutes }]
    : []
  return { ...plan, segments: [...kept, ...reset], chairMinutes, lengthOverride: { chairMinutes, reason } }
}
