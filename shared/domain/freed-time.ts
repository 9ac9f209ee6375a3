// Freed chair time (issue 17 §2): what a change to a visit gives up, so the waitlist can be asked who
// fits it. A cancellation or "did not come" frees the whole visit (named by the visit itself, see
// GET /api/waitlist/matches?visitId=); a move frees the slot it left, a shortened visit (its end
// moved earlier, or procedures taken out) frees its tail. A new shift or extra day frees no chair in
// particular: its window is asked of every chair of the site (a gap without `operatoryId`). Pure.
import type { EpochInterval } from '../types/rota'
import { subtractIntervals } from './intervals'

/** A piece of one chair's time. */
interface ChairSpan {
  siteId: number
  operatoryId: number
  startMs: number
  endMs: number
}

/** The parts of `before` that `after` no longer holds (the whole of it when the visit left the chair). */
export function freedByChange(before: ChairSpan, after: ChairSpan): ChairSpan[] {
  if (before.siteId !== after.siteId || before.operatoryId !== after.operatoryId) return before.endMs > before.startMs ? [before] : []
  const parts: ChairSpan[] = []
  const headEnd = Math.min(before.endMs, after.startMs)
  if (headEnd > before.startMs) parts.push({ ...before, endMs: headEnd })
  const tailStart = Math.max(before.startMs, after.endMs)
  if (before.endMs > tailStart) parts.push({ ...before, startMs: tailStart })
  return parts
}

/** The largest freed piece, or null: the one the Chairboard shows with its waitlist matches. */
export function largestFreed(parts: readonly ChairSpan[]): ChairSpan | null {
  return parts.reduce<ChairSpan | null>((best, part) => (!best || part.endMs - part.startMs > best.endMs - best.startMs ? part : best), null)
}

/** A gap the waitlist is asked about is at most this long (GET /api/waitlist/matches). */
const MAX_GAP_MS = 12 * 3_600_000

/**
 * The provider time a new shift or extra day adds: their time with it minus their time without it,
 * cut into pieces of at most MAX_GAP_MS, earliest first, at most `limit` pieces.
 */
export function addedProviderTime(withIt: readonly EpochInterval[], withoutIt: readonly EpochInterval[], limit = 14): EpochInterval[] {
  const pieces: EpochInterval[] = []
  for (const added of subtractIntervals(withIt, withoutIt)) {
    for (let startMs = added.startMs; startMs < added.endMs && pieces.length < limit; startMs += MAX_GAP_MS) {
      pieces.push({ startMs, endMs: Math.min(added.endMs, startMs + MAX_GAP_MS) })
    }
  }
  return pieces.slice(0, limit)
}
