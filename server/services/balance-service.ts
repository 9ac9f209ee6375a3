// Balance across the caller's sites: each site's calendar expanded over the range (its own local
// dates), the live segments in its chairs, and the pure figures from shared/domain/balance.ts.
// Reads cover all the sites at once where MariaDB does better so (issue 19 §3): site rows, providers,
// outcomes, freed and booked visits; the segments are read per site, a few sites per round trip.
import { eachLocalDate, localDayRange } from '#shared/utils/local-date'
import type { SessionUser } from '#shared/types/auth'
import type { BalanceResponse, SiteBalanceDto } from '#shared/types/balance'
import type { BalanceQuery } from '#shared/schemas/balance'
import { siteBalance, type BalanceThresholds } from '#shared/domain/balance'
import { heldByChair } from '#shared/domain/balance-suggestions'
import { expandAvailabilityMs } from '#shared/domain/rota'
import { useDb, type Db } from '../utils/db'
import { badRequest } from '../utils/errors'
import { requireSiteAccess } from '../utils/auth'
import { listSites } from '../repositories/sites'
import { loadSiteCalendars } from '../repositories/site-calendar'
import { chairSegmentsOfSites, providersByIds } from '../repositories/openings-inputs'
import { visitOutcomes } from '../repositories/visit-outcomes'
import { LATE_CANCEL_HOURS, outcomeRates, type VisitOutcome } from '#shared/domain/visit-outcomes'
import { refillFigures, type FreedVisit, type LaterVisit } from '#shared/domain/balance-refill'
import { bookedVisits, freedVisits } from '../repositories/balance-inputs'
import { scheduleNowMs } from '../utils/clock'

/** Each local date from..to with its own start and end instants (23 or 25 hours across a DST change). */
function localDays(from: string, to: string, zone: string) {
  return eachLocalDate(from, to).map((date) => {
    const day = localDayRange(date, zone)
    return { date, startMs: Date.parse(day.fromUtc), endMs: Date.parse(day.toUtc) }
  })
}

/**
 * Each site's calendar over the range (its own local dates), its chairs' held time and the chair
 * figures: shared with the suggestions. The site rows and the providers' names are one read each
 * for all the sites; the segments one read per site, sent in a few round trips
 * (`chairSegmentsOfSites`). Each site's figures are worked out as its segments arrive, and only its
 * merged held time is kept: at group scale a week is 77,000 segments, and keeping them all to the end
 * of the request sent them through the garbage collector's old space on every request (issue 19 §3).
 */
export async function sitesFigures(db: Db, siteIds: readonly number[], query: Pick<BalanceQuery, 'from' | 'to'>, thresholds: BalanceThresholds) {
  const sites = (await loadSiteCalendars(db, siteIds)).map((calendar) => {
    const zone = calendar.site.timeZone
    const fromMs = Date.parse(localDayRange(query.from, zone).fromUtc)
    const toMs = Date.parse(localDayRange(query.to, zone).toUtc)
    const availability = expandAvailabilityMs({ ...calendar, fromUtc: new Date(fromMs).toISOString(), toUtc: new Date(toMs).toISOString() })
    return { calendar, zone, fromMs, toMs, availability, rooms: calendar.operatoryDetails.filter((room) => room.active) }
  })
  if (!sites.length) return []
  const segmentsOf = chairSegmentsOfSites(db, sites.map((site) => ({ operatoryIds: site.rooms.map((room) => room.id), fromMs: site.fromMs, toMs: site.toMs })))
  const providers = await providersByIds(db, [...new Set(sites.flatMap((site) => site.availability.providers.map((entry) => entry.providerId)))])
  const nameOf = new Map(providers.map((provider) => [provider.id, provider.name]))
  return Promise.all(sites.map(async ({ calendar, zone, fromMs, toMs, availability, rooms }, index) => {
    const segments = await segmentsOf[index]!
    const names = new Map(availability.providers.filter((entry) => nameOf.has(entry.providerId)).map((entry) => [entry.providerId, nameOf.get(entry.providerId)!]))
    const chairTime = rooms.map((room) => ({ operatoryId: room.id, intervals: availability.operatories.find((entry) => entry.operatoryId === room.id)?.intervals ?? [] }))
    const providerTime = availability.providers.filter((entry) => names.has(entry.providerId))
    const days = localDays(query.from, query.to, zone)
    const figures = siteBalance({ fromMs, toMs, segments, days, operatories: chairTime, providers: providerTime }, thresholds)
    return { calendar, zone, fromMs, toMs, rooms, held: heldByChair(segments), names, chairTime, providerTime, days, figures }
  }))
}

export type SiteFigures = Awaited<ReturnType<typeof sitesFigures>>[number]

interface SiteReads {
  outcomes: Map<number, VisitOutcome[]>
  freed: Map<number, FreedVisit[]>
  booked: Map<number, LaterVisit[]>
}

function oneSite(site: { id: number; name: string }, { zone, rooms, names, figures }: SiteFigures, reads: SiteReads, nowMs: number): SiteBalanceDto {
  const outcomes = outcomeRates(reads.outcomes.get(site.id) ?? [], nowMs)
  const refill = refillFigures(reads.freed.get(site.id) ?? [], reads.booked.get(site.id) ?? [])
  return {
    siteId: site.id, siteName: site.name, timeZone: zone, chairs: figures.chairs, days: figures.days, outcomes, refill,
    operatories: figures.operatories.map(({ operatoryId, ...use }) => ({ id: operatoryId, name: rooms.find((room) => room.id === operatoryId)!.name, ...use })),
    providers: figures.providers.map(({ providerId, ...use }) => ({ id: providerId, name: names.get(providerId)!, ...use }))
      .sort((a, b) => a.name.localeCompare(b.name)),
  }
}

/** The caller's sites, or the one asked for (403 outside the caller's scope, 400 when there is none). */
export async function sitesInScope(db: Db, user: SessionUser, siteId: number | undefined) {
  if (siteId !== undefined) requireSiteAccess(user, siteId)
  const sites = (await listSites(db, user)).filter((site) => siteId === undefined || site.id === siteId)
  if (siteId !== undefined && !sites.length) throw badRequest('siteId', 'no such site')
  return sites
}

export async function balanceAcrossSites(user: SessionUser, query: BalanceQuery): Promise<BalanceResponse> {
  const db = useDb()
  const sites = await sitesInScope(db, user, query.siteId)
  const thresholds = { quietBelow: query.quietBelow, tightFrom: query.tightFrom }
  const all = await sitesFigures(db, sites.map((site) => site.id), query, thresholds)
  const spans = all.map(({ calendar, fromMs, toMs }) => ({ siteId: calendar.site.id, fromMs, toMs }))
  // Freed visits start in the range; a refill may run past its end, so bookings are read a day further.
  const [outcomes, freed, booked] = await Promise.all([
    visitOutcomes(db, spans), freedVisits(db, spans), bookedVisits(db, spans.map((span) => ({ ...span, toMs: span.toMs + 86_400_000 }))),
  ])
  const nowMs = scheduleNowMs()
  const figuresOf = new Map(all.map((figures) => [figures.calendar.site.id, figures]))
  return { from: query.from, to: query.to, lateCancelHours: LATE_CANCEL_HOURS, thresholds, sites: sites.map((site) => oneSite(site, figuresOf.get(site.id)!, { outcomes, freed, booked }, nowMs)) }
}
