// What one Openings search works on: the chairs and providers that could take the visit, with
// their open and free time cut to the part of the calendar the search can touch.
import type { BusySegment, OpeningsQuery, OpeningsSite, PartOfDay } from '../types/openings'
import type { EpochInterval } from '../types/rota'
import { mergeIntervals, subtractIntervals } from './intervals'
import { handsOnStretches, intervalsTouching, type HandsOnStretch, type StartWindow } from './openings-windows'

const MINUTE_MS = 60_000

export interface ChairCandidate {
  siteId: number
  operatoryId: number
  /** Opening hours minus blocks. */
  open: EpochInterval[]
  /** Other visits in this chair, merged. */
  busy: EpochInterval[]
  /** open minus busy. */
  free: EpochInterval[]
}

export interface ProviderCandidate {
  siteId: number
  providerId: number
  /** On shift at this site, minus time off and blocks. */
  onShift: EpochInterval[]
  /** onShift minus hands_on time in other visits (at any site). */
  free: EpochInterval[]
}

export interface SiteCandidates {
  site: OpeningsSite
  /** Active chairs of this site with the capability (and the chosen chair, if any). */
  chairs: ChairCandidate[]
  /** Providers who do the category (and the chosen one, if any); with or without time here. */
  providers: ProviderCandidate[]
}

export interface SearchContext {
  query: OpeningsQuery
  chairMs: number
  handsOn: HandsOnStretch[]
  /** Allowed starts by range and notice: from max(fromMs, now + notice) to just before toMs. */
  bound: StartWindow
  partOfDay: PartOfDay
  sites: SiteCandidates[]
}

interface BusyIndex {
  byOperatory: Map<number, EpochInterval[]>
  handsOnByProvider: Map<number, EpochInterval[]>
}

function pushTo(map: Map<number, EpochInterval[]>, key: number, interval: EpochInterval): void {
  const list = map.get(key)
  if (list) list.push(interval)
  else map.set(key, [interval])
}

function mergeValues(map: Map<number, EpochInterval[]>): void {
  for (const [key, list] of map) map.set(key, mergeIntervals(list))
}

// A chair is held by any segment of another visit; a provider only by their hands_on segments.
function indexBusy(busy: readonly BusySegment[], fromMs: number, toMs: number): BusyIndex {
  const index: BusyIndex = { byOperatory: new Map(), handsOnByProvider: new Map() }
  for (const segment of busy) {
    if (segment.endMs <= fromMs || segment.startMs >= toMs) continue
    const interval = { startMs: segment.startMs, endMs: segment.endMs }
    pushTo(index.byOperatory, segment.operatoryId, interval)
    if (segment.kind === 'hands_on' && segment.providerId !== null) pushTo(index.handsOnByProvider, segment.providerId, interval)
  }
  mergeValues(index.byOperatory)
  mergeValues(index.handsOnByProvider)
  return index
}

function chairsOf(site: OpeningsSite, query: OpeningsQuery, span: EpochInterval, busy: BusyIndex): ChairCandidate[] {
  const openById = new Map(site.availability.operatories.map((o) => [o.operatoryId, o.intervals]))
  return site.operatories
    .filter((o) => o.active && o.siteId === site.id && o.capabilities.includes(query.capability))
    .filter((o) => query.operatoryId === undefined || o.id === query.operatoryId)
    .map((o) => {
      const open = intervalsTouching(openById.get(o.id) ?? [], span.startMs, span.endMs)
      const chairBusy = intervalsTouching(busy.byOperatory.get(o.id) ?? [], span.startMs, span.endMs)
      return { siteId: site.id, operatoryId: o.id, open, busy: chairBusy, free: subtractIntervals(open, chairBusy) }
    })
}

function providersOf(site: OpeningsSite, query: OpeningsQuery, span: EpochInterval, busy: BusyIndex): ProviderCandidate[] {
  const shiftById = new Map(site.availability.providers.filter((p) => p.siteId === site.id).map((p) => [p.providerId, p.intervals]))
  return site.providers
    .filter((p) => p.categories.includes(query.category))
    .filter((p) => query.providerId === undefined || p.id === query.providerId)
    .map((p) => {
      const onShift = intervalsTouching(shiftById.get(p.id) ?? [], span.startMs, span.endMs)
      const handsOn = intervalsTouching(busy.handsOnByProvider.get(p.id) ?? [], span.startMs, span.endMs)
      return { siteId: site.id, providerId: p.id, onShift, free: subtractIntervals(onShift, handsOn) }
    })
}

export function earliestStartMs(query: OpeningsQuery): number {
  return Math.max(query.fromMs, query.nowMs + query.minimumNoticeMinutes * MINUTE_MS)
}

/** Builds the candidates; `ignoreNotice` widens the bound to fromMs (used to explain "too soon"). */
export function buildSearchContext(query: OpeningsQuery, ignoreNotice = false): SearchContext {
  const chairMs = query.plan.chairMinutes * MINUTE_MS
  const bound = { firstMs: ignoreNotice ? query.fromMs : earliestStartMs(query), lastMs: query.toMs - 1 }
  // Everything any allowed start can touch: its chair time lies inside [first, to + chair).
  const span = { startMs: bound.firstMs, endMs: query.toMs + chairMs }
  const busy = indexBusy(query.busy, span.startMs, span.endMs)
  const sites = query.sites.map((site) => ({
    site,
    chairs: chairsOf(site, query, span, busy),
    providers: providersOf(site, query, span, busy),
  }))
  return { query, chairMs, handsOn: handsOnStretches(query.plan), bound, partOfDay: query.partOfDay ?? 'any', sites }
}
