// Balance across the caller's sites: each site's calendar expanded over the range (its own local
// dates), the live segments in its chairs, and the pure figures from shared/domain/balance.ts.
import { eachLocalDate, localDayRange } from '#shared/utils/local-date'
import type { SessionUser } from '#shared/types/auth'
import type { BalanceResponse, SiteBalanceDto } from '#shared/types/balance'
import type { BalanceQuery } from '#shared/schemas/balance'
import { siteBalance, type BalanceThresholds } from '#shared/domain/balance'
import { expandAvailabilityMs } from '#shared/domain/rota'
import { useDb, type Db } from '../utils/db'
import { badRequest } from '../utils/errors'
import { requireSiteAccess } from '../utils/auth'
import { listSites } from '../repositories/sites'
import { loadSiteCalendar } from '../repositories/site-calendar'
import { busySegments, providersByIds } from '../repositories/openings-inputs'
import { visitOutcomes } from '../repositories/visit-outcomes'
import { LATE_CANCEL_HOURS, outcomeRates } from '#shared/domain/visit-outcomes'
import { refillFigures } from '#shared/domain/balance-refill'
import { bookedVisits, freedVisits } from '../repositories/balance-inputs'
import { scheduleNowMs } from '../utils/clock'

/** Each local date from..to with its own start and end instants (23 or 25 hours across a DST change). */
function localDays(from: string, to: string, zone: string) {
  return eachLocalDate(from, to).map((date) => {
    const day = localDayRange(date, zone)
    return { date, startMs: Date.parse(day.fromUtc), endMs: Date.parse(day.toUtc) }
  })
}

/** A site's calendar over the range, its chairs' live segments, and the chair figures: shared with the suggestions. */
export async function siteFigures(db: Db, siteId: number, query: Pick<BalanceQuery, 'from' | 'to'>, thresholds: BalanceThresholds) {
  const calendar = (await loadSiteCalendar(db, siteId))!
  const zone = calendar.site.timeZone
  const fromMs = Date.parse(localDayRange(query.from, zone).fromUtc)
  const toMs = Date.parse(localDayRange(query.to, zone).toUtc)
  const availability = expandAvailabilityMs({ ...calendar, fromUtc: new Date(fromMs).toISOString(), toUtc: new Date(toMs).toISOString() })
  const rooms = calendar.operatoryDetails.filter((room) => room.active)
  const segments = await busySegments(db, rooms.map((room) => room.id), [], fromMs, toMs)
  const names = new Map((await providersByIds(db, availability.providers.map((entry) => entry.providerId))).map((provider) => [provider.id, provider.name]))
  const chairTime = rooms.map((room) => ({ operatoryId: room.id, intervals: availability.operatories.find((entry) => entry.operatoryId === room.id)?.intervals ?? [] }))
  const providerTime = availability.providers.filter((entry) => names.has(entry.providerId))
  const days = localDays(query.from, query.to, zone)
  const figures = siteBalance({ fromMs, toMs, segments, days, operatories: chairTime, providers: providerTime }, thresholds)
  return { calendar, zone, fromMs, toMs, rooms, segments, names, chairTime, providerTime, days, figures }
}

async function oneSite(db: Db, site: { id: number; name: string }, query: BalanceQuery, thresholds: BalanceThresholds): Promise<SiteBalanceDto> {
  const { zone, fromMs, toMs, rooms, names, figures } = await siteFigures(db, site.id, query, thresholds)
  const outcomes = outcomeRates(await visitOutcomes(db, site.id, fromMs, toMs), scheduleNowMs())
  // Freed visits start in the range; a refill may run past its end, so bookings are read a day further.
  const refill = refillFigures(await freedVisits(db, site.id, fromMs, toMs), await bookedVisits(db, site.id, fromMs, toMs + 86_400_000))
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
  return { from: query.from, to: query.to, lateCancelHours: LATE_CANCEL_HOURS, thresholds, sites: await Promise.all(sites.map((site) => oneSite(db, site, query, thresholds))) }
}
