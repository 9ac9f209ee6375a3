// Openings: where and when a visit plan fits, across the sites a user may book for.
import { localDayRange } from '#shared/utils/local-date'
import type { SessionUser } from '#shared/types/auth'
import type { OpeningDto, OpeningsResponse } from '#shared/types/visits'
import type { BookingUnitMinutes, VisitPlan } from '#shared/types/chair-time'
import type { Opening, OpeningsSite } from '#shared/types/openings'
import type { OpeningsRequest } from '#shared/schemas/visits'
import { expandAvailabilityMs } from '#shared/domain/rota'
import { findOpenings, formatOpening } from '#shared/domain/openings'
import { useDb, type Db } from '../utils/db'
import { scheduleNowMs } from '../utils/clock'
import { badRequest, rethrowDomainError } from '../utils/errors'
import { canAccessSite, requireSiteAccess } from '../utils/auth'
import { listSites } from '../repositories/sites'
import { loadSiteCalendar, providerIdsAtSite, type SiteCalendarInputs } from '../repositories/site-calendar'
import { busySegments, providersByIds, type ProviderRow } from '../repositories/openings-inputs'
import { planItems, type ResolvedPlan } from './plan-service'

interface SiteSearch {
  siteId: number
  siteName: string
  calendar: SiteCalendarInputs
  providers: ProviderRow[]
  fromMs: number
  toMs: number
}

/** from/to are dates read in each site's own zone: 'to' includes its whole day. */
function rangeInZone(from: string, to: string, zone: string) {
  return {
    fromMs: Date.parse(localDayRange(from, zone).fromUtc),
    toMs: Date.parse(localDayRange(to, zone).toUtc),
  }
}

async function siteSearch(db: Db, site: { id: number; name: string }, request: OpeningsRequest): Promise<SiteSearch> {
  const calendar = (await loadSiteCalendar(db, site.id))!
  const providerIds = providerIdsAtSite(calendar)
  const providers = await providersByIds(db, request.providerId ? providerIds.filter((id) => id === request.providerId) : providerIds)
  return { siteId: site.id, siteName: site.name, calendar, providers, ...rangeInZone(request.from, request.to, calendar.site.timeZone) }
}

function openingsSite(search: SiteSearch): OpeningsSite {
  const { calendar } = search
  return {
    id: search.siteId,
    timeZone: calendar.site.timeZone,
    bookingUnitMinutes: calendar.bookingUnitMinutes as BookingUnitMinutes,
    operatories: calendar.operatoryDetails.map((room) => ({ id: room.id, siteId: search.siteId, active: room.active, capabilities: room.capabilities })),
    providers: search.providers.map((provider) => ({ id: provider.id, categories: provider.categories })),
    availability: expandAvailabilityMs({ ...calendar, fromUtc: new Date(search.fromMs).toISOString(), toUtc: new Date(search.toMs + 86_400_000).toISOString() }),
  }
}

function toDto(opening: Opening, search: SiteSearch, inScope: boolean): OpeningDto {
  const times = formatOpening(opening, search.calendar.site.timeZone)
  return {
    siteId: opening.siteId, siteName: search.siteName,
    operatoryId: opening.operatoryId, operatoryName: search.calendar.operatoryDetails.find((room) => room.id === opening.operatoryId)?.name ?? '',
    providerId: opening.providerId, providerName: search.providers.find((provider) => provider.id === opening.providerId)?.name ?? '',
    startUtc: times.startUtc, endUtc: times.endUtc, startLocalIso: times.startLocalIso, timeZone: times.timeZone, inScope,
  }
}

/** Each site books in its own unit, so the plan is made per site (rounding differs). */
async function searchOneSite(db: Db, search: SiteSearch, request: OpeningsRequest): Promise<{ resolved: ResolvedPlan; openings: Array<{ opening: Opening; search: SiteSearch }>; reasons: string[] }> {
  const resolved = await planItems(db, request.items, search.calendar.bookingUnitMinutes as BookingUnitMinutes)
  const site = openingsSite(search)
  const busy = await busySegments(db, site.operatories.map((room) => room.id), site.providers.map((provider) => provider.id), search.fromMs, search.toMs + 86_400_000)
  const first = resolved.templates[0]!
  try {
    const result = findOpenings({
      plan: resolved.plan, capability: first.capability, category: first.category, sites: [site], busy,
      fromMs: search.fromMs, toMs: search.toMs, nowMs: scheduleNowMs(), minimumNoticeMinutes: search.calendar.minimumNoticeMinutes,
      providerId: request.providerId, operatoryId: request.operatoryId, partOfDay: request.partOfDay, limit: request.limit, fewestGaps: request.fewestGaps,
    })
    return { resolved, openings: result.openings.map((opening) => ({ opening, search })), reasons: result.reasons ?? [] }
  } catch (error) {
    rethrowDomainError(error)
  }
}

export async function searchOpenings(request: OpeningsRequest, user: SessionUser): Promise<OpeningsResponse> {
  const db = useDb()
  // A whole-group search (for the patient's convenience) looks at every active site; the others only
  // at the caller's own. Booking still follows the caller's scope (POST /api/visits answers 403).
  const allowed = await listSites(db, request.wholeGroup ? { allSites: true, siteIds: [] } : user)
  const chosen = request.siteIds ?? allowed.map((site) => site.id)
  if (!request.wholeGroup) for (const siteId of chosen) requireSiteAccess(user, siteId)
  const sites = allowed.filter((site) => chosen.includes(site.id))
  if (!sites.length) throw badRequest('siteIds', 'no such site')

  const results = await Promise.all(sites.map(async (site) => searchOneSite(db, await siteSearch(db, site, request), request)))
  const found = results.flatMap((result) => result.openings)
  if (!request.fewestGaps) found.sort((a, b) => a.opening.startMs - b.opening.startMs)
  const plan: VisitPlan = results[0]!.resolved.plan
  const reasons = found.length ? [] : [...new Set(results.flatMap((result) => result.reasons))]
  // Only the openings returned are put on the wall clock (each site finds up to `limit` of its own).
  return { plan, openings: found.slice(0, request.limit).map(({ opening, search }) => toDto(opening, search, canAccessSite(user, opening.siteId))), reasons }
}

/**
 * The first openings for a plan at one site, with no signed-in user (the patient's recall page):
 * the same engine and inputs as the staff search, restricted to that site.
 */
export async function openingsAtSite(db: Db, site: { id: number; name: string }, request: OpeningsRequest): Promise<{ plan: VisitPlan; openings: OpeningDto[] }> {
  const result = await searchOneSite(db, await siteSearch(db, site, request), request)
  return { plan: result.resolved.plan, openings: result.openings.slice(0, request.limit).map(({ opening, search }) => toDto(opening, search, true)) }
}
