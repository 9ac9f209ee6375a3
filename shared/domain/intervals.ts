// Half-open interval arithmetic on epoch milliseconds: [startMs, endMs).
// Inputs need not be sorted or merged; outputs are sorted, merged and free of empty intervals.

import type { EpochInterval, UtcInterval } from '../types/rota'

function byStart(a: EpochInterval, b: EpochInterval): number {
  return a.startMs - b.startMs || a.endMs - b.endMs
}

function isNonEmpty(interval: EpochInterval): boolean {
  return interval.endMs > interval.startMs
}

/** Already sorted, merged and free of empty intervals (what every function here returns). */
function isMerged(intervals: readonly EpochInterval[]): boolean {
  for (let index = 0; index < intervals.length; index += 1) {
    const interval = intervals[index]!
    if (interval.endMs <= interval.startMs) return false
    if (index > 0 && interval.startMs <= intervals[index - 1]!.endMs) return false
  }
  return true
}

/** Each interval starts no earlier than the one before it. */
function isSortedByStart(intervals: readonly EpochInterval[]): boolean {
  for (let index = 1; index < intervals.length; index += 1) {
    if (intervals[index]!.startMs < intervals[index - 1]!.startMs) return false
  }
  return true
}

/**
 * Sorts and joins overlapping or touching intervals; drops empty ones. Input that is already merged
 * (the output of any function here, passed on) comes back as a new list of the same interval objects,
 * without sorting: Balance merges such lists many times per site (issue 19 §3). Input already in
 * order of start (a chair's segments as MariaDB reads them off its index) is joined without sorting.
 */
export function mergeIntervals(intervals: readonly EpochInterval[]): EpochInterval[] {
  if (isMerged(intervals)) return intervals.slice()
  const sorted = isSortedByStart(intervals) ? intervals : intervals.slice().sort(byStart)
  const merged: EpochInterval[] = []
  for (const next of sorted) {
    if (!isNonEmpty(next)) continue
    const last = merged[merged.length - 1]
    // Touching intervals join too, so 08:00–12:00 and 12:00–17:00 read as one stretch.
    if (last && next.startMs <= last.endMs) {
      last.endMs = Math.max(last.endMs, next.endMs)
    } else {
      merged.push({ startMs: next.startMs, endMs: next.endMs })
    }
  }
  return merged
}

/** The parts of `base` not covered by any of `cuts`. */
export function subtractIntervals(
  base: readonly EpochInterval[],
  cuts: readonly EpochInterval[],
): EpochInterval[] {
  const kept = mergeIntervals(base)
  const holes = mergeIntervals(cuts)
  const result: EpochInterval[] = []
  let holeIndex = 0
  for (const piece of kept) {
    let cursor = piece.startMs
    // Holes ending before this piece can never touch a later piece either (both lists sorted).
    while (holeIndex < holes.length && holes[holeIndex]!.endMs <= cursor) holeIndex++
    let scan = holeIndex
    while (scan < holes.length && holes[scan]!.startMs < piece.endMs) {
      const hole = holes[scan]!
      if (hole.startMs > cursor) result.push({ startMs: cursor, endMs: hole.startMs })
      cursor = Math.max(cursor, hole.endMs)
      scan++
    }
    if (cursor < piece.endMs) result.push({ startMs: cursor, endMs: piece.endMs })
  }
  return result
}

/** Time covered by both `a` and `b`. */
export function intersectIntervals(
  a: readonly EpochInterval[],
  b: readonly EpochInterval[],
): EpochInterval[] {
  const left = mergeIntervals(a)
  const right = mergeIntervals(b)
  const result: EpochInterval[] = []
  let i = 0
  let j = 0
  while (i < left.length && j < right.length) {
    const startMs = Math.max(left[i]!.startMs, right[j]!.startMs)
    const endMs = Math.min(left[i]!.endMs, right[j]!.endMs)
    if (startMs < endMs) result.push({ startMs, endMs })
    // Advance whichever ends first; the other may still overlap the next one.
    if (left[i]!.endMs < right[j]!.endMs) i++
    else j++
  }
  return result
}

/** Intersects with a single window [fromMs, toMs). */
export function clipIntervals(
  intervals: readonly EpochInterval[],
  fromMs: number,
  toMs: number,
): EpochInterval[] {
  return intersectIntervals(intervals, [{ startMs: fromMs, endMs: toMs }])
}

/** True when the two half-open intervals share at least one instant. */
export function intervalsOverlap(a: EpochInterval, b: EpochInterval): boolean {
  return a.startMs < b.endMs && b.startMs < a.endMs
}

/** Total milliseconds covered (overlaps counted once). */
export function totalDurationMs(intervals: readonly EpochInterval[]): number {
  return mergeIntervals(intervals).reduce((sum, i) => sum + (i.endMs - i.startMs), 0)
}

/** Parses an ISO instant; rejects strings without an explicit offset so the machine's zone never leaks in. */
export function parseUtcInstant(iso: string): number {
  if (!/(Z|[+-]\d{2}:?\d{2})$/i.test(iso)) {
    throw new RangeError(`Instant "${iso}" needs a 'Z' or an explicit offset`)
  }
  const ms = Date.parse(iso)
  if (Number.isNaN(ms)) throw new RangeError(`Instant "${iso}" is not a valid ISO 8601 date-time`)
  return ms
}

export function toUtcInterval(interval: EpochInterval): UtcInterval {
  return {
    startUtc: new Date(interval.startMs).toISOString(),
    endUtc: new Date(interval.endMs).toISOString(),
  }
}

export function fromUtcInterval(interval: UtcInterval): EpochInterval {
  return { startMs: parseUtcInstant(interval.startUtc), endMs: parseUtcInstant(interval.endUtc) }
}
