// Start windows: the sets of start instants at which one rule holds, as sorted inclusive ranges.
//
// Every rule of an opening becomes "the start lies in one of these windows":
// - the chair is free for [s, s + chair) ⇔ s ∈ [a, b − chair] for a free chair interval [a, b);
// - the provider is free for a hands-on stretch [s + o, s + o + len) ⇔ s ∈ [a − o, b − o − len]
//   for a free provider interval [a, b).
// So a whole plan is an intersection of sorted lists, done by two-pointer sweeps: cost grows with
// the number of intervals, not with the minutes in the range.
import type { OpeningsPlan } from '../types/openings'
import type { EpochInterval } from '../types/rota'

const MINUTE_MS = 60_000

/** Starts from firstMs to lastMs, both included. */
export interface StartWindow {
  firstMs: number
  lastMs: number
}

/** A run of back-to-back hands_on minutes, as an offset from the visit's start. */
export interface HandsOnStretch {
  offsetMs: number
  lengthMs: number
}

/** No rule yet: every start. */
export const EVERY_START: readonly StartWindow[] = [{ firstMs: -Infinity, lastMs: Infinity }]

/** The plan's hands_on segments, back-to-back ones joined (fewer lists to intersect). */
export function handsOnStretches(plan: OpeningsPlan): HandsOnStretch[] {
  const stretches: HandsOnStretch[] = []
  const sorted = plan.segments.filter((s) => s.kind === 'hands_on' && s.endMinute > s.startMinute)
    .sort((a, b) => a.startMinute - b.startMinute)
  for (const segment of sorted) {
    const offsetMs = segment.startMinute * MINUTE_MS
    const endMs = segment.endMinute * MINUTE_MS
    const last = stretches[stretches.length - 1]
    if (last && offsetMs <= last.offsetMs + last.lengthMs) last.lengthMs = Math.max(last.lengthMs, endMs - last.offsetMs)
    else stretches.push({ offsetMs, lengthMs: endMs - offsetMs })
  }
  return stretches
}

/** Starts s for which [s + offsetMs, s + offsetMs + lengthMs) lies inside one of `free` (sorted, merged). */
export function startsFitting(free: readonly EpochInterval[], offsetMs: number, lengthMs: number): StartWindow[] {
  const windows: StartWindow[] = []
  for (const interval of free) {
    if (interval.endMs - interval.startMs >= lengthMs) {
      windows.push({ firstMs: interval.startMs - offsetMs, lastMs: interval.endMs - offsetMs - lengthMs })
    }
  }
  return windows
}

/** Starts in both lists (each sorted and disjoint). */
export function intersectWindows(a: readonly StartWindow[], b: readonly StartWindow[]): StartWindow[] {
  const result: StartWindow[] = []
  let i = 0
  let j = 0
  while (i < a.length && j < b.length) {
    const left = a[i]!
    const right = b[j]!
    const firstMs = Math.max(left.firstMs, right.firstMs)
    const lastMs = Math.min(left.lastMs, right.lastMs)
    if (firstMs <= lastMs) result.push({ firstMs, lastMs })
    // The window that ends first cannot meet anything further along the other list.
    if (left.lastMs < right.lastMs) i++
    else j++
  }
  return result
}

/** Starts the chair can take: free for the whole chair time. */
export function chairStartWindows(free: readonly EpochInterval[], chairMs: number): StartWindow[] {
  return startsFitting(free, 0, chairMs)
}

/** Starts the provider can take: free during every hands-on stretch of the plan, and only then. */
export function providerStartWindows(free: readonly EpochInterval[], stretches: readonly HandsOnStretch[]): StartWindow[] {
  let windows: readonly StartWindow[] = EVERY_START
  for (const stretch of stretches) windows = intersectWindows(windows, startsFitting(free, stretch.offsetMs, stretch.lengthMs))
  return [...windows]
}

/** Whether t lies in one of the windows (binary search). */
export function windowsContain(windows: readonly StartWindow[], t: number): boolean {
  let lo = 0
  let hi = windows.length - 1
  while (lo <= hi) {
    const mid = (lo + hi) >> 1
    const window = windows[mid]!
    if (t < window.firstMs) hi = mid - 1
    else if (t > window.lastMs) lo = mid + 1
    else return true
  }
  return false
}

/** The intervals of a sorted, disjoint list that touch [fromMs, toMs), found by binary search. */
export function intervalsTouching(list: readonly EpochInterval[], fromMs: number, toMs: number): EpochInterval[] {
  let lo = 0
  let hi = list.length
  while (lo < hi) {
    const mid = (lo + hi) >> 1
    if (list[mid]!.endMs <= fromMs) lo = mid + 1
    else hi = mid
  }
  let end = lo
  while (end < list.length && list[end]!.startMs < toMs) end++
  return list.slice(lo, end)
}
