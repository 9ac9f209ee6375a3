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
import { scheduleNowMs } from '../utils/clock'

/** Each local date from..to with its own start and end instants (23 or 25 hours across a DST change). */
function localDays(from: string, to: string, zone: string) {
  return eachLocalDate(from, to).map((date) => {
    const day = localDayRange(date, zone)
    return { date, startMs: Date.parse(day.fromUtc), endMs: Date.parse(day.toUtc) }
  })
}

async function oneSite(db: Db, site: { id: number; name: string }, query: BalanceQuery, thresholds: BalanceThresholds): Promise<SiteBalanceDto> {
  const calendar = (await loadSiteCalendar(db, site.id))!
  const zone = calendar.site.timeZone
  const fromMs = Date.parse(localDayRange(query.from, zone).fromUtc)
  const toMs = Date.parse(localDayRange(query.to, zone).toUtc)
  const availability = expandAvailabilityMs({ ...calendar, fromUtc: new Date(fromMs).toISOString(), toUtc: new Date(toMs).toISOString() })
  const rooms = calendar.operatoryDetails.filter((room) => room.active)
  const segments = await busySegments(db, rooms.map((room) => room.id), [], fromMs, toMs)
  const names = new Map((await providersByIds(db, availability.providers.map((entry) => entry.providerId))).map((provider) => [provider.id, provider.name]))
  const figures = siteBalance({
    fromMs, toMs, segments, days: localDays(query.from, query.to, zone),
    operatories: rooms.map((room) => ({ operatoryId: room.id, intervals: availability.operatories.find((entry) => entry.operatoryId === room.id)?.intervals ?? [] })),
    providers: availability.providers.filter((entry) => names.has(entry.providerId)),
  }, thresholds)
  const outcomes = outcomeRates(await visitOutcomes(db, site.id, fromMs, toMs), scheduleNowMs())
  return {
    siteId: site.id, siteName: site.name, timeZone: zone, chairs: figures.chairs, days: figures.days, outcomes,
    operatories: figures.operatories.map(({ operatoryId, ...use }) => ({ id: operatoryId, name: rooms.find((room) => room.id === operatoryId)!.name, ...use })),
    providers: figures.providers.map(({ providerId, ...use }) => ({ id: providerId, name: names.get(providerId)!, ...use }))
      .sort((a, b) => a.name.localeCompare(b.name)),
  }
}

export async function balanceAcrossSites(user: SessionUser, query: BalanceQuery): Promise<BalanceResponse> {
  const db = useDb()
  if (query.siteId !== undefined) requireSiteAccess(user, query.siteId)
  const sites = (await listSites(db, user)).filter((site) => query.siteId === undefined || site.id === query.siteId)
  if (query.siteId !== undefined && !sites.length) throw badRequest('siteId', 'no such site')
  const thresholds = { quietBelow: query.quietBelow, tightFrom: query.tightFrom }
  return { from: query.from, to: query.to, lateCancelHours: LATE_CANCEL_HOURS, thresholds, sites: await Promise.all(sites.map((site) => oneSite(db, site, query, thresholds))) }
}
