// A deliberately plain reference for the Openings search: every minute of the range, every
// chair, every provider, every rule checked literally. Shared by the property test and the bench.
// It imports nothing from the engine; local time comes straight from luxon.
import { IANAZone } from 'luxon'
import type { BusySegment, Opening, OpeningsQuery, OpeningsSite } from '../../shared/types/openings'
import type { EpochInterval } from '../../shared/types/rota'

const MINUTE_MS = 60_000

function overlaps(a: EpochInterval, b: EpochInterval): boolean {
  return a.startMs < b.endMs && b.startMs < a.endMs
}

/** Every instant of `span` lies in some interval of `list` (the list need not be merged). */
function covered(list: readonly EpochInterval[], span: EpochInterval): boolean {
  let cursor = span.startMs
  while (cursor < span.endMs) {
    const holder = list.find((i) => i.startMs <= cursor && cursor < i.endMs)
    if (!holder) return false
    cursor = holder.endMs
  }
  return true
}

/** Busy segments grouped once so the scan stays bearable on a month of visits. */
export interface BruteForceIndex {
  byOperatory: Map<number, BusySegment[]>
  byProvider: Map<number, BusySegment[]>
}

export function indexForBruteForce(busy: readonly BusySegment[]): BruteForceIndex {
  const byOperatory = new Map<number, BusySegment[]>()
  const byProvider = new Map<number, BusySegment[]>()
  const add = (map: Map<number, BusySegment[]>, key: number, segment: BusySegment) => {
    const list = map.get(key)
    if (list) list.push(segment)
    else map.set(key, [segment])
  }
  for (const segment of busy) {
    add(byOperatory, segment.operatoryId, segment)
    if (segment.providerId !== null) add(byProvider, segment.providerId, segment)
  }
  return { byOperatory, byProvider }
}

interface LocalClock {
  minuteOfDay: number
  second: number
}

function localClock(zone: string, t: number): LocalClock {
  const wall = t + IANAZone.create(zone).offset(t) * MINUTE_MS
  const d = new Date(wall)
  return { minuteOfDay: d.getUTCHours() * 60 + d.getUTCMinutes(), second: d.getUTCSeconds() * 1000 + d.getUTCMilliseconds() }
}

/** The first rule an opening breaks, or null when it is a real opening. */
export function firstViolation(query: OpeningsQuery, index: BruteForceIndex, opening: Opening): string | null {
  const site = query.sites.find((s) => s.id === opening.siteId)
  if (!site) return 'unknown site'
  const chairTime = { startMs: opening.startMs, endMs: opening.startMs + query.plan.chairMinutes * MINUTE_MS }
  if (opening.endMs !== chairTime.endMs) return 'end is not start + chair time'
  return timeViolation(query, site, opening.startMs) ?? chairViolation(query, index, site, opening, chairTime) ?? providerViolation(query, index, site, opening)
}

function timeViolation(query: OpeningsQuery, site: OpeningsSite, start: number): string | null {
  if (start < query.fromMs || start >= query.toMs) return 'outside the range'
  if (start < query.nowMs + query.minimumNoticeMinutes * MINUTE_MS) return 'inside the minimum notice'
  const clock = localClock(site.timeZone, start)
  if (clock.second !== 0 || clock.minuteOfDay % site.bookingUnitMinutes !== 0) return 'off the booking grid'
  const part = query.partOfDay ?? 'any'
  if (part === 'morning' && clock.minuteOfDay >= 720) return 'not in the morning'
  if (part === 'afternoon' && clock.minuteOfDay < 720) return 'not in the afternoon'
  return null
}

function chairViolation(query: OpeningsQuery, index: BruteForceIndex, site: OpeningsSite, opening: Opening, chairTime: EpochInterval): string | null {
  const operatory = site.operatories.find((o) => o.id === opening.operatoryId && o.siteId === site.id)
  if (!operatory || !operatory.active) return 'chair not in use'
  if (query.operatoryId !== undefined && operatory.id !== query.operatoryId) return 'not the chosen chair'
  if (!operatory.capabilities.includes(query.capability)) return 'chair lacks the equipment'
  const open = site.availability.operatories.find((o) => o.operatoryId === operatory.id)?.intervals ?? []
  if (!covered(open, chairTime)) return 'chair closed'
  if ((index.byOperatory.get(operatory.id) ?? []).some((b) => overlaps(b, chairTime))) return 'chair busy'
  return null
}

function providerViolation(query: OpeningsQuery, index: BruteForceIndex, site: OpeningsSite, opening: Opening): string | null {
  const provider = site.providers.find((p) => p.id === opening.providerId)
  if (!provider) return 'provider not at this site'
  if (query.providerId !== undefined && provider.id !== query.providerId) return 'not the chosen provider'
  if (!provider.categories.includes(query.category)) return 'provider does not do this'
  const shift = site.availability.providers.find((p) => p.providerId === provider.id && p.siteId === site.id)?.intervals ?? []
  const theirs = index.byProvider.get(provider.id) ?? []
  for (const segment of query.plan.segments) {
    if (segment.kind !== 'hands_on' || segment.endMinute <= segment.startMinute) continue
    const span = { startMs: opening.startMs + segment.startMinute * MINUTE_MS, endMs: opening.startMs + segment.endMinute * MINUTE_MS }
    if (!covered(shift, span)) return 'provider off shift'
    if (theirs.some((b) => b.kind === 'hands_on' && overlaps(b, span))) return 'provider hands-on elsewhere'
  }
  return null
}

/** One point for starting where a visit in the chair ends, one for ending where one starts. */
export function bruteForceGapScore(index: BruteForceIndex, opening: Opening): number {
  const segments = index.byOperatory.get(opening.operatoryId) ?? []
  const before = segments.some((b) => b.endMs === opening.startMs) ? 1 : 0
  const after = segments.some((b) => b.startMs === opening.endMs) ? 1 : 0
  return before + after
}

function compareOpenings(query: OpeningsQuery, index: BruteForceIndex) {
  const pref = (match: boolean) => (match ? 0 : 1)
  return (a: Opening, b: Opening): number =>
    (query.fewestGaps ? bruteForceGapScore(index, b) - bruteForceGapScore(index, a) : 0) ||
    a.startMs - b.startMs ||
    pref(a.providerId === query.preferredProviderId) - pref(b.providerId === query.preferredProviderId) ||
    pref(a.siteId === query.preferredSiteId) - pref(b.siteId === query.preferredSiteId) ||
    a.siteId - b.siteId ||
    a.operatoryId - b.operatoryId ||
    a.providerId - b.providerId
}

/**
 * Openings by a minute-by-minute scan, ranked as documented in shared/domain/openings.ts, at
 * most `query.limit` (default 10). Without fewestGaps it stops after the minute that fills the limit.
 */
export function bruteForceOpenings(query: OpeningsQuery, index = indexForBruteForce(query.busy)): Opening[] {
  const limit = query.limit ?? 10
  const chairMs = query.plan.chairMinutes * MINUTE_MS
  const found: Opening[] = []
  const firstMinute = Math.ceil(query.fromMs / MINUTE_MS) * MINUTE_MS
  // The same checks as firstViolation, nested so a failing site or chair skips its inner loops.
  for (let t = firstMinute; t < query.toMs; t += MINUTE_MS) {
    for (const site of query.sites) {
      if (timeViolation(query, site, t) !== null) continue
      for (const operatory of site.operatories) {
        const chairTime = { startMs: t, endMs: t + chairMs }
        const base = { siteId: site.id, operatoryId: operatory.id, startMs: t, endMs: t + chairMs }
        if (chairViolation(query, index, site, { ...base, providerId: -1 }, chairTime) !== null) continue
        for (const provider of site.providers) {
          const candidate = { ...base, providerId: provider.id }
          if (providerViolation(query, index, site, candidate) === null) found.push(candidate)
        }
      }
    }
    if (!query.fewestGaps && found.length >= limit) break
  }
  return found.sort(compareOpenings(query, index)).slice(0, limit)
}
