// Refilled time on Balance (issue 17 §3): of the chair time that cancellations and "did not come"
// freed, how much later bookings took again, and how soon. Pure; times are epoch milliseconds.
//
// Definitions (our own; common practice, no source):
// - A freed span is a cancelled or missed visit's chair time from the moment it was freed (the
//   cancellation, or the visit being marked did not come) to its end: time already past when it was
//   freed could not be refilled and is not counted. A visit freed after its end frees nothing.
// - A refill is a visit in the same chair, not cancelled, booked (created) after the time was freed,
//   that overlaps the freed span. The refilled share is the union of the refills' overlaps.
// - "How soon" is the time from freeing to the first refill's booking, in hours; the median over the
//   spans that were refilled at all.
import type { EpochInterval } from '../types/rota'
import { clipIntervals, mergeIntervals, totalDurationMs } from './intervals'

export interface FreedVisit {
  visitId: number
  operatoryId: number
  startMs: number
  endMs: number
  /** When the time was given back (the cancellation, or the visit marked did not come). */
  freedAtMs: number
}

export interface LaterVisit {
  visitId: number
  operatoryId: number
  startMs: number
  endMs: number
  /** When it was booked. */
  createdAtMs: number
}

export interface RefillFigures {
  /** Freed spans counted (visits that still had time ahead when freed). */
  freedVisits: number
  freedMinutes: number
  /** Spans that later bookings took at least a part of. */
  refilledVisits: number
  refilledMinutes: number
  /** refilledMinutes / freedMinutes, or null when nothing was freed. */
  refilledShare: number | null
  /** Median hours from freeing to the first refill's booking, or null when nothing was refilled. */
  medianHoursToRefill: number | null
}

const HOUR_MS = 3_600_000

export function median(values: readonly number[]): number | null {
  if (!values.length) return null
  const sorted = [...values].sort((a, b) => a - b)
  const middle = Math.floor(sorted.length / 2)
  return sorted.length % 2 ? sorted[middle]! : (sorted[middle - 1]! + sorted[middle]!) / 2
}

export function refillFigures(freed: readonly FreedVisit[], later: readonly LaterVisit[]): RefillFigures {
  let freedMs = 0
  let refilledMs = 0
  let freedVisits = 0
  let refilledVisits = 0
  const delays: number[] = []
  // Later visits sorted into their chairs once, so each freed span looks only at its own chair's.
  const laterIn = new Map<number, LaterVisit[]>()
  for (const other of later) {
    const chair = laterIn.get(other.operatoryId)
    if (chair) chair.push(other)
    else laterIn.set(other.operatoryId, [other])
  }
  for (const visit of freed) {
    const span: EpochInterval = { startMs: Math.max(visit.startMs, visit.freedAtMs), endMs: visit.endMs }
    if (span.endMs <= span.startMs) continue
    freedVisits += 1
    freedMs += span.endMs - span.startMs
    const refills = (laterIn.get(visit.operatoryId) ?? []).filter((other) => other.visitId !== visit.visitId
      && other.createdAtMs > visit.freedAtMs && other.startMs < span.endMs && other.endMs > span.startMs)
    if (!refills.length) continue
    refilledVisits += 1
    refilledMs += totalDurationMs(clipIntervals(mergeIntervals(refills), span.startMs, span.endMs))
    delays.push((Math.min(...refills.map((other) => other.createdAtMs)) - visit.freedAtMs) / HOUR_MS)
  }
  return {
    freedVisits, freedMinutes: Math.round(freedMs / 60_000), refilledVisits, refilledMinutes: Math.round(refilledMs / 60_000),
    refilledShare: freedMs > 0 ? refilledMs / freedMs : null, medianHoursToRefill: median(delays),
  }
}
