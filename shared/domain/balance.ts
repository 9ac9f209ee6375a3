// Balance: how much of each chair's open time and each provider's shift time visits take, over a
// range. Pure; times are epoch milliseconds. A chair is "held" by any segment of a live visit (the
// chair is taken while numbing and during reset too); a provider is "working" only in hands_on
// segments, the time nobody else can use. Shares are of the time open (chairs) or on shift
// (providers) inside the range. When the caller gives the site's days, a chair's open time on a day
// with nobody on shift at the site is not counted (nobody could have worked in it, so it is not
// "quiet" time going unused); such a day is marked `nobodyOnShift`.
import type { EpochInterval } from '../types/rota'
import type { StepKind } from '../types/chair-time'
import { clipIntervals, intersectIntervals, mergeIntervals, subtractIntervals, totalDurationMs } from './intervals'

export interface BalanceSegment {
  operatoryId: number
  /** Null for time that needs no provider (a reset, say). */
  providerId: number | null
  kind: StepKind
  startMs: number
  endMs: number
}

export interface BalanceInput {
  fromMs: number
  toMs: number
  /** Open, unblocked time per chair (from the rota expansion). */
  operatories: Array<{ operatoryId: number; intervals: readonly EpochInterval[] }>
  /** On-shift, unblocked time per provider at this site. */
  providers: Array<{ providerId: number; intervals: readonly EpochInterval[] }>
  /** Live visits' segments in this site's chairs. */
  segments: readonly BalanceSegment[]
  /** The site's local days inside the range (the caller finds their edges in the site's zone). */
  days?: ReadonlyArray<{ date: string; startMs: number; endMs: number }>
}

/** Where a share sits against the manager's two thresholds. Our own words. */
export type BalanceBand = 'quiet' | 'steady' | 'tight'

export interface BalanceThresholds {
  /** Below this share a chair or provider is 'quiet' (time going unused). */
  quietBelow: number
  /** At or above this share it is 'tight' (no room left for an emergency). */
  tightFrom: number
}

/** Defaults a practice can change (query parameters of GET /api/balance); common practice, no source. */
export const DEFAULT_BALANCE_THRESHOLDS: BalanceThresholds = { quietBelow: 0.5, tightFrom: 0.9 }

export interface UseFigures {
  availableMinutes: number
  usedMinutes: number
  /** usedMinutes / availableMinutes, or null when there was no time to use. */
  share: number | null
  band: BalanceBand | null
}

export interface ChairUse extends UseFigures { operatoryId: number }
export interface ProviderUse extends UseFigures { providerId: number }

export interface DayUse extends UseFigures {
  date: string
  /** No provider had shift time at the site that day: its open chair hours are left out. */
  nobodyOnShift: boolean
}

export interface SiteBalance {
  operatories: ChairUse[]
  providers: ProviderUse[]
  /** All chairs of the site together. */
  chairs: UseFigures
  /** All chairs together, day by day: which days are quiet and which are tight. */
  days: DayUse[]
}

export function bandOf(share: number | null, thresholds: BalanceThresholds = DEFAULT_BALANCE_THRESHOLDS): BalanceBand | null {
  if (share === null) return null
  if (share < thresholds.quietBelow) return 'quiet'
  if (share >= thresholds.tightFrom) return 'tight'
  return 'steady'
}

function figures(availableMs: number, usedMs: number, thresholds: BalanceThresholds): UseFigures {
  const share = availableMs > 0 ? usedMs / availableMs : null
  return { availableMinutes: Math.round(availableMs / 60_000), usedMinutes: Math.round(usedMs / 60_000), share, band: bandOf(share, thresholds) }
}

/** Used time counts only inside the available time, so a share never passes 100 %. */
function usedWithin(available: readonly EpochInterval[], used: EpochInterval[]): number {
  return totalDurationMs(intersectIntervals(available, mergeIntervals(used)))
}

/** The items under each key, in one pass (items whose key is undefined are left out). */
function bucketBy<T, K>(items: readonly T[], keyOf: (item: T) => K | undefined): Map<K, T[]> {
  const buckets = new Map<K, T[]>()
  for (const item of items) {
    const key = keyOf(item)
    if (key === undefined) continue
    const bucket = buckets.get(key)
    if (bucket) bucket.push(item)
    else buckets.set(key, [item])
  }
  return buckets
}

/**
 * Linear in the segments: they are sorted into chairs and providers once, each chair's held time
 * is merged once and cut into days, instead of every chair and day filtering every segment.
 * tests/unit/shared/domain/balance.properties.test.ts checks it against the first, plain version.
 */
export function siteBalance(input: BalanceInput, thresholds: BalanceThresholds = DEFAULT_BALANCE_THRESHOLDS): SiteBalance {
  const range = { startMs: input.fromMs, endMs: input.toMs }
  const shiftTime = mergeIntervals(input.providers.flatMap((provider) => provider.intervals))
  const unstaffed = (input.days ?? []).filter((day) => clipIntervals(shiftTime, day.startMs, day.endMs).length === 0)
  const unstaffedSpans = unstaffed.map((day) => ({ startMs: day.startMs, endMs: day.endMs }))
  const clip = (intervals: readonly EpochInterval[]) => clipIntervals(mergeIntervals(intervals), range.startMs, range.endMs)
  const openTime = (intervals: readonly EpochInterval[]) => subtractIntervals(clip(intervals), unstaffedSpans)
  const heldBy = bucketBy(input.segments, (segment) => segment.operatoryId)
  const workingBy = bucketBy(input.segments, (segment) => (segment.kind === 'hands_on' && segment.providerId !== null ? segment.providerId : undefined))
  const chairs = input.operatories.map(({ operatoryId, intervals }) => {
    const openAllDay = mergeIntervals(intervals)
    const held = mergeIntervals(heldBy.get(operatoryId) ?? [])
    // Open and held: cut into days below (the same time as cutting the open time first).
    return { operatoryId, openAllDay, held, openHeld: intersectIntervals(openAllDay, held), open: openTime(intervals) }
  })
  let chairsAvailable = 0
  let chairsUsed = 0
  const operatories = chairs.map(({ operatoryId, open, held }) => {
    const availableMs = totalDurationMs(open)
    const usedMs = usedWithin(open, held)
    chairsAvailable += availableMs
    chairsUsed += usedMs
    return { operatoryId, ...figures(availableMs, usedMs, thresholds) }
  })
  const providers = input.providers.map(({ providerId, intervals }) => {
    const onShift = clip(intervals)
    return { providerId, ...figures(totalDurationMs(onShift), usedWithin(onShift, workingBy.get(providerId) ?? []), thresholds) }
  })
  const days = (input.days ?? []).map((day) => {
    const nobodyOnShift = unstaffed.includes(day)
    if (nobodyOnShift) return { date: day.date, ...figures(0, 0, thresholds), nobodyOnShift }
    const startMs = Math.max(day.startMs, range.startMs)
    const endMs = Math.min(day.endMs, range.endMs)
    let availableMs = 0
    let usedMs = 0
    for (const chair of chairs) {
      availableMs += totalDurationMs(clipIntervals(chair.openAllDay, startMs, endMs))
      usedMs += totalDurationMs(clipIntervals(chair.openHeld, startMs, endMs))
    }
    return { date: day.date, ...figures(availableMs, usedMs, thresholds), nobodyOnShift }
  })
  return { operatories, providers, chairs: figures(chairsAvailable, chairsUsed, thresholds), days }
}
