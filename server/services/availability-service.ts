// Availability of one site over a window: loads the rota, expands it (shared/domain/rota.ts) and
// adds each instant on the site's wall clock. the offsets come from the shared local-date helpers.
import type { SiteDetail } from '#shared/types/sites'
import type { AvailabilityResponse, DualInterval } from '#shared/types/rota-api'
import type { LocalDate, UtcInterval } from '#shared/types/rota'
import { expandAvailability } from '#shared/domain/rota'
import { addDays, localDayRange, localIsoAt, type UtcRange } from '#shared/utils/local-date'
import type { AvailabilityQuery } from '#shared/schemas/rota'
import { useDb, type Db } from '../utils/db'
import { notFound } from '../utils/errors'
import { listOperatories } from '../repositories/operatories'
import { listShifts, shiftToInput } from '../repositories/shifts'
import { exceptionToInput, listShiftExceptions } from '../repositories/shift-exceptions'
import { blockToInput, listBlocks } from '../repositories/blocks'
import { findSiteDetail, toCalendar } from '../repositories/sites'

/**
 * The site's local days `from`..`to`, both included, as the UTC range [fromUtc, toUtc). The schema
 * (AvailabilityQuerySchema) has already held them to real dates at most MAX_WINDOW_DAYS days apart.
 */
export function windowOf(site: SiteDetail, from: LocalDate, to: LocalDate): UtcRange {
  return { fromUtc: localDayRange(from, site.timeZone).fromUtc, toUtc: localDayRange(to, site.timeZone).toUtc }
}

function onWallClock(instantUtc: string, zone: string): string {
  return localIsoAt(Date.parse(instantUtc), zone) || instantUtc
}

/**
 * Wall-clock times for one response. Chairs, providers and blocks share most of their edges (the same
 * opening and shift times every day), so each instant is turned into local time once: at the widest
 * window (93 days) this took the response from about 110 ms of CPU to about 40 ms (scripts/bench/range-routes.bench.ts).
 */
function wallClockOf(zone: string): (instantUtc: string) => string {
  const seen = new Map<string, string>()
  return (instantUtc) => {
    let local = seen.get(instantUtc)
    if (local === undefined) {
      local = onWallClock(instantUtc, zone)
      seen.set(instantUtc, local)
    }
    return local
  }
}

function dual(interval: UtcInterval, local: (instantUtc: string) => string): DualInterval {
  return { ...interval, startLocalIso: local(interval.startUtc), endLocalIso: local(interval.endUtc) }
}

export async function siteAvailability(db: Db, site: SiteDetail, window: UtcRange): Promise<AvailabilityResponse> {
  // A day of slack each side: local dates of the window can differ from its UTC dates.
  const fromDate = addDays(window.fromUtc.slice(0, 10), -1)
  const toDate = addDays(window.toUtc.slice(0, 10), 1)
  const [operatories, shifts, exceptions, blocks] = await Promise.all([
    listOperatories(db, site.id),
    listShifts(db, { siteIds: [site.id], activeFrom: fromDate, activeTo: toDate }),
    listShiftExceptions(db, { siteIds: [site.id], from: fromDate, to: toDate }),
    listBlocks(db, { siteIds: [site.id], from: fromDate, to: toDate }),
  ])
  const expanded = expandAvailability({
    site: toCalendar(site),
    operatories: operatories.map((room) => ({ id: room.id, siteId: room.siteId, active: room.active })),
    shifts: shifts.map(shiftToInput),
    exceptions: exceptions.map(exceptionToInput),
    blocks: blocks.map(blockToInput),
    ...window,
  })
  const zone = site.timeZone
  const local = wallClockOf(zone)
  return {
    siteId: site.id,
    timeZone: zone,
    ...window,
    operatories: expanded.operatories.map((room) => ({ operatoryId: room.operatoryId, intervals: room.intervals.map((i) => dual(i, local)) })),
    providers: expanded.providers.map((p) => ({ providerId: p.providerId, siteId: p.siteId, intervals: p.intervals.map((i) => dual(i, local)) })),
    blocks: expanded.blocks.map((block) => ({
      blockId: block.blockId, operatoryId: block.operatoryId, providerId: block.providerId, reason: block.reason,
      ...dual({ startUtc: block.startUtc, endUtc: block.endUtc }, local),
    })),
  }
}

/** The site's availability over the asked window (the caller's access to the site is checked first). */
export async function availabilityOf(query: AvailabilityQuery): Promise<AvailabilityResponse> {
  const db = useDb()
  const site = await findSiteDetail(db, query.siteId)
  if (!site) throw notFound('No such site.')
  return siteAvailability(db, site, windowOf(site, query.from, query.to))
}
