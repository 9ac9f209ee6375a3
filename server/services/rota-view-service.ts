// The Rota grid's data: one site's week, or one provider's week across the sites the caller sees.
import type { SessionUser } from '#shared/types/auth'
import type { BlockDto, RotaView, ShiftDto, ShiftExceptionDto } from '#shared/types/rota-api'
import type { RotaListQuery } from '#shared/schemas/rota'
import { rotaEntries } from '#shared/domain/rota-week'
import { managesProvider, TIME_OFF_SHOWN_AS } from '#shared/utils/access'
import { canAccessSite, requireSiteAccess } from '../utils/auth'
import { useDb, type Db } from '../utils/db'
import { badRequest, notFound } from '../utils/errors'
import { findProvider, findProviderIdOfUser, listProviders } from '../repositories/providers'
import { findSiteDetails, listSiteDetails, toCalendar } from '../repositories/sites'
import { listShifts, shiftToInput } from '../repositories/shifts'
import { exceptionToInput, listShiftExceptions } from '../repositories/shift-exceptions'
import { blockToInput, listBlocks } from '../repositories/blocks'

const MAX_DAYS = 42

export interface RotaWindow {
  siteId?: number
  providerId?: number
  from: string
  to: string
}

function checkSpan(from: string, to: string): void {
  if ((Date.parse(to) - Date.parse(from)) / 86_400_000 >= MAX_DAYS) throw badRequest('to', `must be less than ${MAX_DAYS} days after from`)
}

async function siteIdsInView(db: Db, user: SessionUser, query: RotaWindow): Promise<number[]> {
  if (query.siteId !== undefined) {
    requireSiteAccess(user, query.siteId)
    return [query.siteId]
  }
  const provider = await findProvider(db, query.providerId!)
  if (!provider) throw notFound('No such provider.')
  // A provider's view shows only the sites the caller may see; time off for all sites shows too.
  const visible = (await listSiteDetails(db, user)).map((site) => site.id)
  return visible.filter((siteId) => canAccessSite(user, siteId))
}

/** Which sites a rota list may show: the one asked for (checked), or all the caller's sites. */
async function rotaSiteIds(db: Db, user: SessionUser, siteId: number | undefined): Promise<number[]> {
  if (siteId !== undefined) {
    requireSiteAccess(user, siteId)
    return [siteId]
  }
  return (await listSiteDetails(db, user)).map((site) => site.id)
}

export async function shiftList(user: SessionUser, query: RotaListQuery): Promise<ShiftDto[]> {
  const db = useDb()
  return listShifts(db, { siteIds: await rotaSiteIds(db, user, query.siteId), providerId: query.providerId })
}

export async function blockList(user: SessionUser, query: RotaListQuery): Promise<BlockDto[]> {
  const db = useDb()
  return listBlocks(db, { siteIds: await rotaSiteIds(db, user, query.siteId), providerId: query.providerId })
}

/** Time off for every site included; reasons as shownTimeOff allows. */
export async function shiftExceptionList(user: SessionUser, query: RotaListQuery): Promise<ShiftExceptionDto[]> {
  const db = useDb()
  const exceptions = await listShiftExceptions(db, { siteIds: await rotaSiteIds(db, user, query.siteId), providerId: query.providerId })
  return shownTimeOff(db, user, exceptions)
}

/**
 * Time off "for every site" is drawn at the sites where the provider has shifts in view: on
 * each of them in a site's week, once (at the first) in a provider's week.
 */
function placeTimeOff(exceptions: ShiftExceptionDto[], shifts: ShiftDto[], siteView: boolean): ShiftExceptionDto[] {
  return exceptions.flatMap((exception) => {
    if (exception.siteId !== null) return [exception]
    const siteIds = [...new Set(shifts.filter((shift) => shift.providerId === exception.providerId).map((shift) => shift.siteId))]
    if (siteView) return siteIds.map((siteId) => ({ ...exception, siteId }))
    return [{ ...exception, siteId: siteIds[0] ?? null }]
  })
}

/**
 * Time-off reasons may be medical: only admins and managers of a site the provider works at (and
 * the provider themself) read them; everyone else reads "away". Extra days keep their note.
 */
export async function shownTimeOff(db: Db, user: SessionUser, exceptions: ShiftExceptionDto[]): Promise<ShiftExceptionDto[]> {
  if (!exceptions.some((exception) => exception.kind === 'time_off')) return exceptions
  const [providers, ownId] = await Promise.all([listProviders(db, null), findProviderIdOfUser(db, user.id)])
  const sitesOf = new Map(providers.map((provider) => [provider.id, provider.siteIds]))
  return exceptions.map((exception) => {
    if (exception.kind !== 'time_off' || exception.providerId === ownId) return exception
    if (managesProvider(user, sitesOf.get(exception.providerId) ?? [])) return exception
    return { ...exception, reason: TIME_OFF_SHOWN_AS }
  })
}

export async function rotaView(db: Db, user: SessionUser, query: RotaWindow): Promise<RotaView> {
  checkSpan(query.from, query.to)
  const siteIds = await siteIdsInView(db, user, query)
  const window = { from: query.from, to: query.to }
  const [sites, shifts, exceptions, blocks, providers] = await Promise.all([
    findSiteDetails(db, siteIds),
    listShifts(db, { siteIds, providerId: query.providerId, activeFrom: window.from, activeTo: window.to }),
    listShiftExceptions(db, { siteIds, providerId: query.providerId, ...window }).then((rows) => shownTimeOff(db, user, rows)),
    listBlocks(db, { siteIds, providerId: query.providerId, ...window }),
    listProviders(db, null),
  ])
  const names = new Map(providers.map((provider) => [provider.id, provider.name]))
  const entries = rotaEntries({
    sites: sites.map(toCalendar),
    shifts: shifts.map(shiftToInput),
    exceptions: placeTimeOff(exceptions, shifts, query.siteId !== undefined).map(exceptionToInput),
    blocks: blocks.map(blockToInput),
    fromDate: window.from,
    toDate: window.to,
    providerName: (id) => names.get(id) ?? `Provider ${id}`,
  })
  return { ...window, entries, shifts, exceptions, blocks }
}
