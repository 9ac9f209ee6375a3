// Waitlist matching (issue 17 §2): which waiting patients could take a piece of chair time that has
// just been freed (a cancellation, a visit marked did not come, a move out of the slot). Pure.
//
// The openings engine (openings.ts) decides whether a plan fits: chair capability, chair open and
// free, a provider on shift who does the procedure and is not hands-on elsewhere, the booking grid.
// It is asked once per distinct plan, restricted to the freed chair and the freed window (`openingsInGap`),
// and every waiting entry with that plan then only has its own wishes checked (`matchWaitlist`):
// acceptable site, date window, part of day and the notice the patient needs. So 5,000 entries cost
// a handful of engine searches plus one pass over the entries.
//
// Ranking: priority (1 first), then the longest waiting (oldest entry first), then entry id.
import type { Opening, OpeningsQuery, PartOfDay } from '../types/openings'
import { findOpenings } from './openings'
import { isInPartOfDay } from './openings-grid'
import { localDateAt } from '../utils/local-date'

const MINUTE_MS = 60_000

/** A freed piece of one chair's time, or of every chair of the site (null: a new shift or extra day). */
export interface FreedGap {
  siteId: number
  operatoryId: number | null
  timeZone: string
  startMs: number
  endMs: number
}

/** What the matcher needs of one waitlist entry. */
export interface WaitlistCandidate {
  id: number
  siteIds: readonly number[]
  /** Local dates at the gap's site, both included. */
  fromDate: string
  toDate: string
  partOfDay: PartOfDay
  noticeMinutes: number
  /** 1 (first) to 5. */
  priority: number
  createdAtMs: number
  /** Entries with the same plan share one engine search (the items as JSON, say). */
  planKey: string
}

export interface WaitlistMatch {
  entryId: number
  opening: Opening
}

/** Every start of a plan inside the gap, on its chair (any chair of the site without one), earliest first (the engine, restricted). */
export function openingsInGap(query: Omit<OpeningsQuery, 'fromMs' | 'toMs' | 'operatoryId' | 'limit' | 'partOfDay'>, gap: FreedGap): Opening[] {
  if (gap.endMs <= gap.startMs) return []
  return findOpenings({ ...query, fromMs: gap.startMs, toMs: gap.endMs, operatoryId: gap.operatoryId ?? undefined, limit: Infinity, partOfDay: 'any' }).openings
    .filter((opening) => opening.siteId === gap.siteId)
}

/** The earliest start that meets the entry's wishes, or null. */
export function firstFitFor(entry: WaitlistCandidate, openings: readonly Opening[], gap: FreedGap, nowMs: number): Opening | null {
  if (!entry.siteIds.includes(gap.siteId)) return null
  const earliest = nowMs + entry.noticeMinutes * MINUTE_MS
  for (const opening of openings) {
    if (opening.startMs < earliest) continue
    if (!isInPartOfDay(opening.startMs, gap.timeZone, entry.partOfDay)) continue
    const day = localDateAt(opening.startMs, gap.timeZone)
    if (day < entry.fromDate || day > entry.toDate) continue
    return opening
  }
  return null
}

export function compareWaitlistRank(a: WaitlistCandidate, b: WaitlistCandidate): number {
  return a.priority - b.priority || a.createdAtMs - b.createdAtMs || a.id - b.id
}

/**
 * The entries that fit the gap, ranked, each with the earliest start it can take.
 * `openingsByPlan` holds `openingsInGap` per plan key; an entry whose plan is missing does not fit.
 */
export function matchWaitlist(input: {
  gap: FreedGap
  entries: readonly WaitlistCandidate[]
  openingsByPlan: ReadonlyMap<string, readonly Opening[]>
  nowMs: number
  limit?: number
}): WaitlistMatch[] {
  const fits: Array<{ entry: WaitlistCandidate; opening: Opening }> = []
  for (const entry of input.entries) {
    const openings = input.openingsByPlan.get(entry.planKey)
    if (!openings?.length) continue
    const opening = firstFitFor(entry, openings, input.gap, input.nowMs)
    if (opening) fits.push({ entry, opening })
  }
  fits.sort((a, b) => compareWaitlistRank(a.entry, b.entry))
  return fits.slice(0, input.limit ?? fits.length).map(({ entry, opening }) => ({ entryId: entry.id, opening }))
}

/**
 * When an offer stops being open: the site's offer window after sending (default 2 hours), but
 * never later than the slot's start minus the notice the patient needs. Null when that moment has
 * already passed, so no offer is made to that patient.
 */
export function offerExpiresAtMs(input: { nowMs: number; slotStartMs: number; noticeMinutes: number; offerHours: number }): number | null {
  const latest = input.slotStartMs - input.noticeMinutes * MINUTE_MS
  const expires = Math.min(input.nowMs + input.offerHours * 60 * MINUTE_MS, latest)
  return expires > input.nowMs ? expires : null
}
