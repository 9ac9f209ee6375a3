// Late (glossary): a visit whose patient has not arrived some minutes after its start. The minutes
// are the site's `lateAfterMinutes` (default 10). Pure: the caller passes the clock.
import type { VisitState } from './visit-states'

export const DEFAULT_LATE_AFTER_MINUTES = 10
export const MAX_LATE_AFTER_MINUTES = 120

/** Whether a booked or confirmed visit is late at `nowMs`: `lateAfterMinutes` or more past its start. */
export function isLate(visit: { state: VisitState; startUtc: string }, lateAfterMinutes: number, nowMs: number): boolean {
  if (visit.state !== 'booked' && visit.state !== 'confirmed') return false
  return nowMs >= Date.parse(visit.startUtc) + lateAfterMinutes * 60_000
}

/** "late 14 min": how late in words, whole minutes since the start. */
export function lateText(startUtc: string, nowMs: number): string {
  const minutes = Math.max(0, Math.floor((nowMs - Date.parse(startUtc)) / 60_000))
  return `late ${minutes} min`
}
