// Openings: free times that fit a visit plan, across sites. Pure; instants are UTC epoch ms.
//
// An opening is (site, operatory, provider, start) where
// - the operatory is active, has the template's capability, is open for the whole chair time
//   [start, start + chairMinutes) and no segment of another visit overlaps that time;
// - the provider does the template's category, is on shift at that site during EVERY hands_on
//   segment of the plan and not hands_on in another visit then. During this plan's numbing,
//   assist and reset minutes the provider may be hands-on in another chair: that is the point;
// - the start is on the site's booking grid in local time, at or after now + minimum notice,
//   inside [fromMs, toMs), and in the requested part of the day (a filter).
//
// Search: every rule becomes a sorted list of start windows (openings-windows.ts). Per chair we
// intersect once with opening hours minus other visits, per provider once with shift minus their
// hands_on time elsewhere, then per pair the two lists. A k-way merge over the pairs walks grid
// starts in time order (openings-cursor.ts) and stops after `limit`.
// Earliest-first searches work through growing horizons (1 day, then 4, 16, … days): every start
// in one horizon comes before every start in the next, so the first N are usually found without
// sorting a month of other visits.
//
// Ranking (default): earliest start first; equally early starts → the preferred provider, then
// the preferred site, then by site id, operatory id and provider id so results are stable.
// Part of day is a filter, not a ranking: a patient who asks for mornings gets only mornings.
//
// Ranking with fewestGaps: each opening scores one point for starting exactly where another visit
// in the same chair ends and one for ending exactly where the next one starts (0, 1 or 2). Higher
// scores first; within a score the default order. Only visits count, not opening hours or blocks.
// Scoring needs every opening in the range, so this mode does not stop early.
import type { FormattedOpeningTimes, Opening, OpeningsQuery, OpeningsResult } from '../types/openings'
import type { EpochInterval } from '../types/rota'
import { DomainValidationError } from './errors'
import { buildSearchContext, earliestStartMs, type ChairCandidate, type ProviderCandidate, type SearchContext, type SiteCandidates } from './openings-context'
import { walkStartsInOrder, type Pairing, type TimedStart } from './openings-cursor'
import { explainNoOpenings } from './openings-reasons'
import { chairStartWindows, intersectWindows, providerStartWindows, type StartWindow } from './openings-windows'
import { localIsoAt } from '../utils/local-date'

export const DEFAULT_OPENINGS_LIMIT = 10
const FIRST_HORIZON_MS = 86_400_000
const HORIZON_GROWTH = 4
const BOOKING_UNITS = new Set([5, 10, 15])

// ---------------------------------------------------------------- validation

function fail(field: string, reason: string): never {
  throw new DomainValidationError(field, reason)
}

function validateQuery(query: OpeningsQuery): void {
  if (!Number.isInteger(query.plan.chairMinutes) || query.plan.chairMinutes <= 0) fail('plan.chairMinutes', 'The visit needs a chair time above zero minutes')
  if (!(query.toMs > query.fromMs)) fail('toMs', 'The end of the range must be after its start')
  if (!(query.minimumNoticeMinutes >= 0)) fail('minimumNoticeMinutes', 'The minimum notice cannot be negative')
  const limit = query.limit
  if (limit !== undefined && !(limit >= 1 && (Number.isInteger(limit) || limit === Infinity))) fail('limit', 'The limit must be a whole number above zero')
  query.sites.forEach((site, i) => {
    if (!BOOKING_UNITS.has(site.bookingUnitMinutes)) fail(`sites.${i}.bookingUnitMinutes`, 'The booking unit must be 5, 10 or 15 minutes')
  })
}

// ---------------------------------------------------------------- pairings

function clippedToBound(windows: readonly StartWindow[], bound: StartWindow): StartWindow[] {
  return intersectWindows(windows, [bound])
}

interface TieKey {
  preferredProvider: number
  preferredSite: number
}

function tieKey(query: OpeningsQuery, siteId: number, providerId: number): TieKey {
  return {
    preferredProvider: query.preferredProviderId === providerId ? 0 : 1,
    preferredSite: query.preferredSiteId === siteId ? 0 : 1,
  }
}

function pairingsOfSite(ctx: SearchContext, entry: SiteCandidates): Omit<Pairing, 'rank'>[] {
  const { site } = entry
  const providerWindows = entry.providers.map((provider: ProviderCandidate) => ({
    provider,
    windows: clippedToBound(providerStartWindows(provider.free, ctx.handsOn), ctx.bound),
  }))
  return entry.chairs.flatMap((chair: ChairCandidate) => {
    const chairWindows = clippedToBound(chairStartWindows(chair.free, ctx.chairMs), ctx.bound)
    if (chairWindows.length === 0) return []
    return providerWindows
      .map(({ provider, windows }) => ({
        siteId: site.id,
        operatoryId: chair.operatoryId,
        providerId: provider.providerId,
        timeZone: site.timeZone,
        unitMinutes: site.bookingUnitMinutes,
        windows: intersectWindows(chairWindows, windows),
      }))
      .filter((pairing) => pairing.windows.length > 0)
  })
}

/** Every (chair, provider) pair with at least one possible start, ranked for ties. */
function rankedPairings(ctx: SearchContext): Pairing[] {
  const pairings = ctx.sites.flatMap((entry) => pairingsOfSite(ctx, entry))
  const keyed = pairings.map((p) => ({ p, key: tieKey(ctx.query, p.siteId, p.providerId) }))
  keyed.sort(
    (a, b) =>
      a.key.preferredProvider - b.key.preferredProvider ||
      a.key.preferredSite - b.key.preferredSite ||
      a.p.siteId - b.p.siteId ||
      a.p.operatoryId - b.p.operatoryId ||
      a.p.providerId - b.p.providerId,
  )
  return keyed.map(({ p }, rank) => ({ ...p, rank }))
}

// ---------------------------------------------------------------- ranking

function toOpening(start: TimedStart, chairMs: number): Opening {
  const { siteId, operatoryId, providerId } = start.pairing
  return { siteId, operatoryId, providerId, startMs: start.startMs, endMs: start.startMs + chairMs }
}

function earliestFirstInContext(ctx: SearchContext, pairings: readonly Pairing[], limit: number): Opening[] {
  const openings: Opening[] = []
  walkStartsInOrder(pairings, ctx.partOfDay, (start) => {
    openings.push(toOpening(start, ctx.chairMs))
    return openings.length < limit
  })
  return openings
}

interface ChairEdges {
  visitEnds: Set<number>
  visitStarts: Set<number>
}

function chairEdges(ctx: SearchContext): Map<number, ChairEdges> {
  const edges = new Map<number, ChairEdges>()
  for (const chair of ctx.sites.flatMap((entry) => entry.chairs)) {
    const busy: EpochInterval[] = chair.busy
    edges.set(chair.operatoryId, {
      visitEnds: new Set(busy.map((b) => b.endMs)),
      visitStarts: new Set(busy.map((b) => b.startMs)),
    })
  }
  return edges
}

/** 0–2: one point per side of the opening that sits against another visit in the same chair. */
function gapScore(opening: Opening, edges: ChairEdges | undefined): number {
  if (!edges) return 0
  return (edges.visitEnds.has(opening.startMs) ? 1 : 0) + (edges.visitStarts.has(opening.endMs) ? 1 : 0)
}

/** The whole range in one pass: every opening, ranked by fewest gaps when asked. */
function fewestGapsOrAll(query: OpeningsQuery, limit: number): Opening[] {
  const ctx = buildSearchContext(query)
  const pairings = rankedPairings(ctx)
  const all = earliestFirstInContext(ctx, pairings, Infinity)
  if (!query.fewestGaps) return all
  const edges = chairEdges(ctx)
  const scored = all.map((opening) => ({ opening, score: gapScore(opening, edges.get(opening.operatoryId)) }))
  // Array.prototype.sort is stable, so equal scores keep the default (earliest-first) order.
  scored.sort((a, b) => b.score - a.score)
  return scored.slice(0, limit).map((s) => s.opening)
}

/** Earliest first, horizon by horizon, until `limit` openings are found or the range ends. */
function earliestFirst(query: OpeningsQuery, limit: number): Opening[] {
  const openings: Opening[] = []
  let horizonStart = Math.max(query.fromMs, Math.min(earliestStartMs(query), query.toMs))
  let horizonMs = FIRST_HORIZON_MS
  while (horizonStart < query.toMs && openings.length < limit) {
    const horizonEnd = Math.min(query.toMs, horizonStart + horizonMs)
    const ctx = buildSearchContext({ ...query, fromMs: horizonStart, toMs: horizonEnd })
    openings.push(...earliestFirstInContext(ctx, rankedPairings(ctx), limit - openings.length))
    horizonStart = horizonEnd
    horizonMs *= HORIZON_GROWTH
  }
  return openings
}

// ---------------------------------------------------------------- entry points

/** Openings for a visit plan, ranked, at most `limit`; with reasons and near misses when none fit. */
export function findOpenings(query: OpeningsQuery): OpeningsResult {
  validateQuery(query)
  const limit = query.limit ?? DEFAULT_OPENINGS_LIMIT
  // Horizons only pay when few openings are wanted; a full list is one pass over the range.
  const openings = query.fewestGaps || limit === Infinity ? fewestGapsOrAll(query, limit) : earliestFirst(query, limit)
  if (openings.length > 0) return { openings }
  return { openings, ...explainNoOpenings(buildSearchContext(query)) }
}

/** An opening's times as UTC and site-local ISO strings. */
export function formatOpening(opening: Pick<Opening, 'startMs' | 'endMs'>, zone: string): FormattedOpeningTimes {
  return {
    startUtc: new Date(opening.startMs).toISOString(),
    endUtc: new Date(opening.endMs).toISOString(),
    startLocalIso: localIsoAt(opening.startMs, zone),
    endLocalIso: localIsoAt(opening.endMs, zone),
    timeZone: zone,
  }
}
