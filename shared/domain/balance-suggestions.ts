// What Balance suggests (issue 17 §3), the pure part: where quiet chair time is, which provider could
// spend a quiet day at a site whose chairs are tight, and which visits could move to join two short
// free stretches of a chair into one a visit can use. Pure; times are epoch milliseconds. The server
// (balance-suggestion-service.ts) fills in patients, waitlist matches and recalls.
//
// Our own rules (common practice, no source):
// - quiet gap: open, unheld chair time ahead of now on a quiet day, at least `minMinutes` long;
// - rota move: on one local date a site is quiet and another is tight, and a provider on shift at the
//   quiet site works at the tight one too (their account covers it) and is not on shift there already;
// - consolidation: a visit with free time on both sides in its chair, each stretch shorter than
//   `minRunMinutes` (too short to book on its own) but together at least that long. Sliding the visit
//   next to its neighbour (or to the opening time) joins them, if its provider is on shift and free then.
import type { EpochInterval } from '../types/rota'
import type { BalanceBand } from './balance'
import { clipIntervals, intersectIntervals, mergeIntervals, subtractIntervals, totalDurationMs } from './intervals'
import { localTime } from '../utils/local-date'

const MINUTE_MS = 60_000

/** What Balance suggests; one code name, `suggestion`, with these kinds. */
export type SuggestionKind = 'waitlist_fit' | 'recall_fit' | 'rota_move' | 'consolidate'

/** At most this many suggestions of each kind per site (rota moves: leaving each site), so the list stays short and quick. */
export const SUGGESTIONS_PER_KIND = 3

export interface ChairOpenTime {
  operatoryId: number
  intervals: readonly EpochInterval[]
}

export interface HeldTime extends EpochInterval {
  operatoryId: number
}

/** Each chair's held time merged: what `quietGaps` needs of a site's segments, in far fewer intervals. */
export function heldByChair(segments: readonly HeldTime[]): HeldTime[] {
  const byChair = new Map<number, EpochInterval[]>()
  for (const segment of segments) {
    const chair = byChair.get(segment.operatoryId)
    if (chair) chair.push(segment)
    else byChair.set(segment.operatoryId, [segment])
  }
  return [...byChair].flatMap(([operatoryId, times]) => mergeIntervals(times).map((time) => ({ operatoryId, startMs: time.startMs, endMs: time.endMs })))
}

export interface QuietGap extends EpochInterval {
  operatoryId: number
}

/** Free chair time ahead of `nowMs` inside `within` (the quiet days), longest first. */
export function quietGaps(input: {
  operatories: readonly ChairOpenTime[]
  held: readonly HeldTime[]
  within: readonly EpochInterval[]
  nowMs: number
  minMinutes: number
  limit: number
}): QuietGap[] {
  const window = mergeIntervals(input.within)
  const gaps: QuietGap[] = []
  for (const chair of input.operatories) {
    const open = intersectIntervals(mergeIntervals(chair.intervals), window)
    const held = mergeIntervals(input.held.filter((time) => time.operatoryId === chair.operatoryId))
    const free = subtractIntervals(clipIntervals(open, input.nowMs, Number.MAX_SAFE_INTEGER), held)
    for (const interval of free) {
      if (interval.endMs - interval.startMs >= input.minMinutes * MINUTE_MS) gaps.push({ operatoryId: chair.operatoryId, ...interval })
    }
  }
  return gaps
    .sort((a, b) => (b.endMs - b.startMs) - (a.endMs - a.startMs) || a.startMs - b.startMs || a.operatoryId - b.operatoryId)
    .slice(0, input.limit)
}

export interface SiteDay {
  siteId: number
  date: string
  share: number | null
  band: BalanceBand | null
  /** Providers with shift time at the site that day. */
  onShift: readonly number[]
}

export interface RotaMove {
  date: string
  providerId: number
  fromSiteId: number
  toSiteId: number
  fromShare: number
  toShare: number
}

/**
 * Providers who could spend a quiet day at a tight site instead, at most `limit` leaving each quiet
 * site. A provider who leaves a colleague on shift behind comes first; then the widest difference
 * between the two sites' shares.
 */
export function rotaMoves(days: readonly SiteDay[], sitesOfProvider: ReadonlyMap<number, readonly number[]>, limit: number): RotaMove[] {
  const byDate = new Map<string, SiteDay[]>()
  for (const day of days) byDate.set(day.date, [...(byDate.get(day.date) ?? []), day])
  const moves: Array<RotaMove & { leavesColleague: boolean }> = []
  for (const [date, sites] of byDate) {
    for (const quiet of sites.filter((day) => day.band === 'quiet' && day.share !== null && day.onShift.length)) {
      for (const tight of sites.filter((day) => day.band === 'tight' && day.share !== null && day.siteId !== quiet.siteId)) {
        for (const providerId of quiet.onShift) {
          if (tight.onShift.includes(providerId) || !sitesOfProvider.get(providerId)?.includes(tight.siteId)) continue
          moves.push({ date, providerId, fromSiteId: quiet.siteId, toSiteId: tight.siteId, fromShare: quiet.share!, toShare: tight.share!, leavesColleague: quiet.onShift.length > 1 })
        }
      }
    }
  }
  const kept = new Map<number, number>()
  return moves
    .sort((a, b) => Number(b.leavesColleague) - Number(a.leavesColleague) || (b.toShare - b.fromShare) - (a.toShare - a.fromShare) || a.date.localeCompare(b.date) || a.providerId - b.providerId)
    .filter((move) => {
      const count = kept.get(move.fromSiteId) ?? 0
      kept.set(move.fromSiteId, count + 1)
      return count < limit
    })
    .map(({ leavesColleague: _, ...move }) => move)
}

/** Where the day lands at the receiving site: epoch instants and the same on that site's clock. */
export interface ReceivingHours extends EpochInterval {
  localStart: string
  localEnd: string
}

/**
 * The hours of a moved rota day at the receiving site (our own rule; common practice, no source):
 * the SAME INSTANTS the provider was to work at the quiet site (so a day moved between time zones
 * keeps its real hours: 08:00-16:00 in Los Angeles becomes 09:00-17:00 in Denver, never the wall
 * clock copied, which would start the provider an hour earlier), clamped to the receiving site's
 * opening hours on that local date (first opening to last closing, so a lunch break does not split
 * the day) and to that date itself. Null when nothing is left: the site is closed that date or
 * opens only outside those hours. `open` is the receiving site's opening hours that date
 * (`siteOpeningOn`).
 */
export function receivingHours(input: { worked: EpochInterval; open: readonly EpochInterval[]; day: EpochInterval; zone: string }): ReceivingHours | null {
  if (!input.open.length) return null
  const startMs = Math.max(input.worked.startMs, Math.min(...input.open.map((range) => range.startMs)), input.day.startMs)
  const endMs = Math.min(input.worked.endMs, Math.max(...input.open.map((range) => range.endMs)), input.day.endMs)
  if (endMs <= startMs) return null
  const clock = (ms: number) => localTime(new Date(ms).toISOString(), input.zone)
  // The end of the local day is written '24:00', as the Rota writes it.
  return { startMs, endMs, localStart: clock(startMs), localEnd: endMs === input.day.endMs ? '24:00' : clock(endMs) }
}

export interface PlacedVisit extends EpochInterval {
  visitId: number
  operatoryId: number
  providerId: number
  /** False for a visit that may not be suggested for a move (too soon, already under way, stranded). */
  movable: boolean
}

export interface ProviderBusy extends EpochInterval {
  visitId: number
  providerId: number
}

export interface ConsolidationMove {
  visitId: number
  operatoryId: number
  fromStartMs: number
  toStartMs: number
  /** The two short free stretches around the visit today, in minutes. */
  stretchesMinutes: [number, number]
  /** The one free stretch the move leaves, in minutes. */
  joinedMinutes: number
}

/** Visits that could slide to join two short free stretches of their chair into one; the longest joined stretch first, one per chair and open span. */
export function consolidationMoves(input: {
  operatories: readonly ChairOpenTime[]
  visits: readonly PlacedVisit[]
  providerShifts: ReadonlyMap<number, readonly EpochInterval[]>
  /** Hands-on time of the providers in any chair. */
  providerBusy: readonly ProviderBusy[]
  minRunMinutes: number
  limit: number
}): ConsolidationMove[] {
  const minRunMs = input.minRunMinutes * MINUTE_MS
  const moves: ConsolidationMove[] = []
  const providerCanTake = (visit: PlacedVisit, startMs: number) => {
    const endMs = startMs + (visit.endMs - visit.startMs)
    const shift = clipIntervals(mergeIntervals(input.providerShifts.get(visit.providerId) ?? []), startMs, endMs)
    if (totalDurationMs(shift) < endMs - startMs) return false
    return !input.providerBusy.some((busy) => busy.providerId === visit.providerId && busy.visitId !== visit.visitId && busy.startMs < endMs && busy.endMs > startMs)
  }
  for (const chair of input.operatories) {
    for (const open of mergeIntervals(chair.intervals)) {
      const inside = input.visits
        .filter((visit) => visit.operatoryId === chair.operatoryId && visit.startMs < open.endMs && visit.endMs > open.startMs)
        .sort((a, b) => a.startMs - b.startMs)
      let best: ConsolidationMove | null = null
      inside.forEach((visit, index) => {
        if (!visit.movable || visit.startMs < open.startMs || visit.endMs > open.endMs) return
        const previousEnd = index === 0 ? open.startMs : Math.max(open.startMs, inside[index - 1]!.endMs)
        const nextStart = index === inside.length - 1 ? open.endMs : Math.min(open.endMs, inside[index + 1]!.startMs)
        const before = visit.startMs - previousEnd
        const after = nextStart - visit.endMs
        if (before <= 0 || after <= 0 || before >= minRunMs || after >= minRunMs || before + after < minRunMs) return
        const toStartMs = [previousEnd, nextStart - (visit.endMs - visit.startMs)].find((startMs) => providerCanTake(visit, startMs))
        if (toStartMs === undefined) return
        const move: ConsolidationMove = {
          visitId: visit.visitId, operatoryId: chair.operatoryId, fromStartMs: visit.startMs, toStartMs,
          stretchesMinutes: [Math.round(before / MINUTE_MS), Math.round(after / MINUTE_MS)], joinedMinutes: Math.round((before + after) / MINUTE_MS),
        }
        if (!best || move.joinedMinutes > best.joinedMinutes) best = move
      })
      if (best) moves.push(best)
    }
  }
  return moves.sort((a, b) => b.joinedMinutes - a.joinedMinutes || a.fromStartMs - b.fromStartMs).slice(0, input.limit)
}
