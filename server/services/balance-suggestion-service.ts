// What Balance suggests (issue 17 §3), per site and range, each with a one-click action on the screen:
// - waitlist_fit: an open waitlist entry whose plan fits quiet chair time, found by the waitlist's own
//   matching (`waitlistMatches`); the screen books it in the drawer or sends the existing offer;
// - recall_fit: an overdue recall whose plan has a real opening in the quiet chair time (`recallFits`);
//   the screen opens exactly that opening in the drawer or sends the existing recall e-mail;
// - rota_move: a provider on shift at a quiet site who works at a tight one that day, with the hours
//   the day would have there on its own clock (`receivingHoursAt`); the screen previews the whole
//   move (day off and extra day) and saves it in one step (POST /api/balance/rota-moves);
// - consolidate: a visit that could slide to join two short free stretches of its chair; the screen
//   sends the patient a move offer (the visit moves only if they accept).
// Bounded: SUGGESTIONS_PER_KIND of each kind per site (rota moves: leaving each site), future time only.
import type { SessionUser } from '#shared/types/auth'
import type { BalanceSuggestion, BalanceSuggestionsResponse, SuggestedGap } from '#shared/types/balance'
import type { BalanceQuery } from '#shared/schemas/balance'
import type { EpochInterval } from '#shared/types/rota'
import type { Opening } from '#shared/types/openings'
import { SUGGESTIONS_PER_KIND, consolidationMoves, quietGaps, rotaMoves, type QuietGap, type SiteDay } from '#shared/domain/balance-suggestions'
import { LATE_CANCEL_HOURS } from '#shared/domain/visit-outcomes'
import { clipIntervals } from '#shared/domain/intervals'
import { addDays, localDateAt, localTime, todayIn } from '#shared/utils/local-date'
import { useDb } from '../utils/db'
import { scheduleNowMs } from '../utils/clock'
import { listProviders } from '../repositories/providers'
import { liveChairVisits, providersHandsOn } from '../repositories/balance-inputs'
import { sitesFigures, sitesInScope, type SiteFigures } from './balance-service'
import { planOpeningsInGap, waitlistMatches } from './waitlist-service'
import { listRecalls } from './recall-service'
import { recallPlanOf } from './recall-page-service'
import { receivingHoursAt, shiftSpanOn } from './rota-move-service'
import { loadSiteCalendar, type SiteCalendarInputs } from '../repositories/site-calendar'

const HOUR_MS = 3_600_000
/** Quiet time shorter than this is not worth a suggestion (common practice, no source). */
const MIN_GAP_MINUTES = 30
/** The waitlist matches a gap of at most 12 hours (WaitlistGapQuerySchema). */
const MAX_GAP_MS = 12 * HOUR_MS

type Figures = SiteFigures

export async function balanceSuggestions(user: SessionUser, query: BalanceQuery): Promise<BalanceSuggestionsResponse> {
  const db = useDb()
  const sites = await sitesInScope(db, user, query.siteId)
  const thresholds = { quietBelow: query.quietBelow, tightFrom: query.tightFrom }
  const nowMs = scheduleNowMs()
  const figuresOf = new Map((await sitesFigures(db, sites.map((site) => site.id), query, thresholds)).map((figures) => [figures.calendar.site.id, figures]))
  const all = sites.map((site) => ({ site, figures: figuresOf.get(site.id)! }))
  const suggestions: BalanceSuggestion[] = []
  for (const { site, figures } of all) {
    const gaps = quietGaps({
      operatories: figures.chairTime, held: figures.held, nowMs, minMinutes: MIN_GAP_MINUTES, limit: SUGGESTIONS_PER_KIND,
      within: figures.figures.days.filter((day) => day.band === 'quiet').map((day) => figures.days.find((edge) => edge.date === day.date)!),
    }).map((gap) => ({ ...gap, endMs: Math.min(gap.endMs, gap.startMs + MAX_GAP_MS) }))
    suggestions.push(...await waitlistFits(user, site.id, figures, gaps))
    suggestions.push(...await recallFits(user, site.id, figures, gaps, nowMs))
    suggestions.push(...await consolidations(site.id, figures, nowMs))
  }
  suggestions.push(...await rotaSuggestions(all, nowMs))
  return { from: query.from, to: query.to, suggestions }
}

function gapDto(figures: Figures, gap: QuietGap): SuggestedGap {
  return {
    operatoryId: gap.operatoryId, operatoryName: figures.rooms.find((room) => room.id === gap.operatoryId)?.name ?? '',
    startUtc: new Date(gap.startMs).toISOString(), endUtc: new Date(gap.endMs).toISOString(),
  }
}

/** The best waitlist match of each quiet gap, each entry suggested once. */
async function waitlistFits(user: SessionUser, siteId: number, figures: Figures, gaps: QuietGap[]): Promise<BalanceSuggestion[]> {
  const used = new Set<number>()
  const found: BalanceSuggestion[] = []
  for (const gap of gaps) {
    const { matches } = await waitlistMatches({ siteId, operatoryId: gap.operatoryId, startUtc: new Date(gap.startMs).toISOString(), endUtc: new Date(gap.endMs).toISOString() }, user)
    const match = matches.find((candidate) => !used.has(candidate.entry.id))
    if (!match) continue
    used.add(match.entry.id)
    found.push({
      id: `waitlist_fit-${siteId}-${match.entry.id}`, kind: 'waitlist_fit', siteId, date: localDateAt(gap.startMs, figures.zone), gap: gapDto(figures, gap),
      entryId: match.entry.id, patientId: match.entry.patientId, patientName: match.entry.patientName, planLabel: match.entry.planLabel, items: match.entry.items,
      providerId: match.providerId, providerName: match.providerName, startUtc: match.startUtc, canOffer: match.canOffer, channels: match.channels, offered: match.offered,
    })
  }
  return found
}

/** How many overdue recalls (earliest due first) are tried against the quiet gaps, at most. */
const RECALLS_TRIED = 30

/**
 * Overdue recalls (earliest due first) whose plan has a real opening in a quiet gap: the recall page's
 * plan, searched by the openings engine restricted to the gap's chair and window (`planOpeningsInGap`,
 * the waitlist matching's search). Each suggestion carries its opening; two never share chair time or
 * the same provider's time.
 */
async function recallFits(user: SessionUser, siteId: number, figures: Figures, gaps: QuietGap[], nowMs: number): Promise<BalanceSuggestion[]> {
  if (!gaps.length) return []
  const db = useDb()
  const overdue = (await listRecalls({ siteId, to: addDays(todayIn(figures.zone, nowMs), -1) }, user)).slice(0, RECALLS_TRIED)
  if (!overdue.length) return []
  const plans = await Promise.all(overdue.map((recall) => recallPlanOf(db, recall)))
  const planKeys = [...new Set(plans.filter((plan) => plan !== null).map((plan) => JSON.stringify(plan.items)))]
  // One engine search per gap and distinct plan (a handful: recall plans are a cleaning or an exam).
  const searched = await Promise.all(gaps.map((gap) => planOpeningsInGap(db, { siteId, operatoryId: gap.operatoryId, startMs: gap.startMs, endMs: gap.endMs }, planKeys.map((key) => JSON.parse(key)))))
  const taken: Array<{ operatoryId: number; providerId: number; startMs: number; endMs: number }> = []
  const clashes = (opening: Opening) => taken.some((other) => other.startMs < opening.endMs && other.endMs > opening.startMs && (other.operatoryId === opening.operatoryId || other.providerId === opening.providerId))
  const found: BalanceSuggestion[] = []
  for (const [index, recall] of overdue.entries()) {
    if (found.length >= SUGGESTIONS_PER_KIND) break
    const plan = plans[index]
    if (!plan) continue
    const key = planKeys.indexOf(JSON.stringify(plan.items))
    for (const [gapIndex, gap] of gaps.entries()) {
      const result = searched[gapIndex]!.found[key]
      const opening = result?.openings.find((candidate) => !clashes(candidate))
      if (!result || !opening) continue
      taken.push(opening)
      found.push({
        id: `recall_fit-${siteId}-${recall.id}`, kind: 'recall_fit', siteId, date: localDateAt(opening.startMs, figures.zone), gap: gapDto(figures, gap),
        recallId: recall.id, patientId: recall.patientId, patientName: recall.patientName, recallKind: recall.kind, dueDate: recall.dueDate,
        canMail: Boolean(recall.email && recall.emailConsent),
        items: plan.items, planLabel: plan.what,
        operatoryId: opening.operatoryId, providerId: opening.providerId, providerName: searched[gapIndex]!.providers.find((provider) => provider.id === opening.providerId)?.name ?? '',
        startUtc: new Date(opening.startMs).toISOString(), endUtc: new Date(opening.endMs).toISOString(),
        chairMinutes: result.resolved.plan.chairMinutes, numbingMinutes: result.resolved.plan.numbingMinutes,
      })
      break
    }
  }
  return found
}

/** Visits at least a day ahead that could slide to join two short free stretches of their chair. */
async function consolidations(siteId: number, figures: Figures, nowMs: number): Promise<BalanceSuggestion[]> {
  const fromMs = Math.max(figures.fromMs, nowMs)
  if (fromMs >= figures.toMs) return []
  const visits = await liveChairVisits(useDb(), siteId, fromMs, figures.toMs)
  if (!visits.length) return []
  const providerIds = [...new Set(visits.map((visit) => visit.providerId))]
  const moves = consolidationMoves({
    operatories: figures.chairTime.map((chair) => ({ operatoryId: chair.operatoryId, intervals: clipIntervals(chair.intervals, fromMs, figures.toMs) })),
    visits: visits.map((visit) => ({
      visitId: visit.id, operatoryId: visit.operatoryId, providerId: visit.providerId, startMs: visit.startMs, endMs: visit.endMs,
      movable: (visit.state === 'booked' || visit.state === 'confirmed') && !visit.stranded && visit.startMs >= nowMs + LATE_CANCEL_HOURS * HOUR_MS,
    })),
    providerShifts: new Map(figures.providerTime.map((entry) => [entry.providerId, entry.intervals])),
    providerBusy: await providersHandsOn(useDb(), providerIds, figures.fromMs, figures.toMs),
    minRunMinutes: 60,
    limit: SUGGESTIONS_PER_KIND,
  })
  return moves.map((move) => {
    const visit = visits.find((candidate) => candidate.id === move.visitId)!
    return {
      id: `consolidate-${siteId}-${visit.id}`, kind: 'consolidate', siteId, date: localDateAt(move.fromStartMs, figures.zone), visitId: visit.id,
      patientName: visit.patientName, patientPhone: visit.patientPhone, patientEmail: visit.emailConsent ? visit.patientEmail : null,
      operatoryId: move.operatoryId, operatoryName: figures.rooms.find((room) => room.id === move.operatoryId)?.name ?? '', providerName: figures.names.get(visit.providerId) ?? '',
      startUtc: new Date(move.fromStartMs).toISOString(), newStartUtc: new Date(move.toStartMs).toISOString(),
      stretchesMinutes: move.stretchesMinutes, joinedMinutes: move.joinedMinutes,
    }
  })
}

/** Providers with shift time at the site on a day, and their first start and last end there. */
function shiftOn(figures: Figures, day: { startMs: number; endMs: number }): Map<number, EpochInterval> {
  const on = new Map<number, EpochInterval>()
  for (const entry of figures.providerTime) {
    const time = clipIntervals(entry.intervals, day.startMs, day.endMs)
    if (time.length) on.set(entry.providerId, { startMs: time[0]!.startMs, endMs: time.at(-1)!.endMs })
  }
  return on
}

async function rotaSuggestions(all: Array<{ site: { id: number; name: string }; figures: Figures }>, nowMs: number): Promise<BalanceSuggestion[]> {
  if (all.length < 2) return []
  const days: SiteDay[] = []
  const hours = new Map<string, EpochInterval>()
  for (const { site, figures } of all) {
    for (const day of figures.figures.days) {
      const edges = figures.days.find((edge) => edge.date === day.date)!
      if (edges.endMs <= nowMs) continue
      const on = shiftOn(figures, edges)
      for (const [providerId, time] of on) hours.set(`${site.id}:${day.date}:${providerId}`, time)
      days.push({ siteId: site.id, date: day.date, share: day.share, band: day.band, onShift: [...on.keys()] })
    }
  }
  if (!days.some((day) => day.band === 'tight')) return []
  const providers = await listProviders(useDb(), null)
  const sitesOf = new Map(providers.filter((provider) => provider.active).map((provider) => [provider.id, provider.siteIds]))
  const calendars = new Map<number, SiteCalendarInputs | undefined>()
  const calendarOf = async (siteId: number) => {
    if (!calendars.has(siteId)) calendars.set(siteId, await loadSiteCalendar(useDb(), siteId))
    return calendars.get(siteId)
  }
  const found: BalanceSuggestion[] = []
  for (const move of rotaMoves(days, sitesOf, SUGGESTIONS_PER_KIND)) {
    const from = all.find((entry) => entry.site.id === move.fromSiteId)!
    const to = all.find((entry) => entry.site.id === move.toSiteId)!
    const time = hours.get(`${move.fromSiteId}:${move.date}:${move.providerId}`)!
    const fromCalendar = await calendarOf(move.fromSiteId)
    const toCalendar = await calendarOf(move.toSiteId)
    // The same hours the one-step move would write (rota-move-service.ts): none left, no suggestion.
    const worked = fromCalendar && shiftSpanOn(fromCalendar, move.providerId, move.date)
    const there = worked && toCalendar ? receivingHoursAt(toCalendar, move.date, worked) : null
    if (!there) continue
    const end = localTime(new Date(time.endMs).toISOString(), from.figures.zone)
    found.push({
      id: `rota_move-${move.fromSiteId}-${move.providerId}-${move.date}-${move.toSiteId}`, kind: 'rota_move', siteId: move.fromSiteId, date: move.date,
      providerId: move.providerId, providerName: providers.find((provider) => provider.id === move.providerId)?.name ?? '',
      fromSiteId: move.fromSiteId, fromSiteName: from.site.name, fromShare: move.fromShare, toSiteId: move.toSiteId, toSiteName: to.site.name, toShare: move.toShare,
      localStart: localTime(new Date(time.startMs).toISOString(), from.figures.zone), localEnd: end === '00:00' && time.endMs > time.startMs ? '24:00' : end,
      toLocalStart: there.localStart, toLocalEnd: there.localEnd,
    })
  }
  return found
}
