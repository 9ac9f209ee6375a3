// Balance's rota move (issue 17 §3) in one step: a provider's day moved from a quiet site to a tight
// one on the same local date, as whole-day time off at the quiet site AND an extra day at the tight
// one, both written in ONE change-impact transaction (`changeWithImpact`): the preview (`dryRun`)
// answers what the whole move strands and writes nothing; the save writes both or neither.
//
// The extra day's hours are the server's (`receivingHours`, our own rule): the same instants the
// provider was to work at the quiet site, clamped to the receiving site's opening hours that date,
// and written on the receiving site's own clock. So between Los Angeles and Denver 08:00–16:00 becomes
// 09:00–17:00 (the provider's real hours), not 08:00–16:00 copied from one wall clock to another.
//
// Refusals: 400 naming the field (no such site or provider, a past date, the same site twice); 409 in
// plain words when there is nothing to move (not on shift at the quiet site that date), the provider
// is already on shift at the tight site, the tight site is closed or not open in those hours, or the
// extra day would clash with another site (the Rota's own check).
import type { SessionUser } from '#shared/types/auth'
import type { EpochInterval } from '#shared/types/rota'
import type { RotaMoveAnswer, RotaMovePlan } from '#shared/types/balance'
import type { RotaMoveInput } from '#shared/schemas/balance'
import { expandAvailabilityMs, siteOpeningOn } from '#shared/domain/rota'
import { receivingHours, type ReceivingHours } from '#shared/domain/balance-suggestions'
import { displayStyleOf, formatLocalDate } from '#shared/utils/display-time'
import { localDayRange, localTime, todayIn } from '#shared/utils/local-date'
import { useDb, type Db } from '../utils/db'
import { badRequest, conflict } from '../utils/errors'
import { requireSiteAccess } from '../utils/auth'
import { scheduleNowMs } from '../utils/clock'
import { findProvider } from '../repositories/providers'
import { loadSiteCalendar, type SiteCalendarInputs } from '../repositories/site-calendar'
import { findSiteDetails } from '../repositories/sites'
import { changeWithImpact } from './impact-service'
import { addShiftException } from './rota-service'

/** The provider's time at the site on a local date, first start to last end; null when not on shift. */
export function shiftSpanOn(calendar: SiteCalendarInputs, providerId: number, date: string): EpochInterval | null {
  const day = localDayRange(date, calendar.site.timeZone)
  const time = expandAvailabilityMs({ ...calendar, fromUtc: day.fromUtc, toUtc: day.toUtc }).providers.find((entry) => entry.providerId === providerId)?.intervals ?? []
  return time.length ? { startMs: time[0]!.startMs, endMs: time.at(-1)!.endMs } : null
}

/** The extra day's hours at the receiving site for a day worked elsewhere (`receivingHours` on its calendar). */
export function receivingHoursAt(calendar: SiteCalendarInputs, date: string, worked: EpochInterval): ReceivingHours | null {
  const day = localDayRange(date, calendar.site.timeZone)
  return receivingHours({ worked, open: siteOpeningOn(calendar.site, date), day: { startMs: Date.parse(day.fromUtc), endMs: Date.parse(day.toUtc) }, zone: calendar.site.timeZone })
}

/** A wall-clock span as 'HH:mm', the end of the local day as '24:00'. */
function clockSpan(span: EpochInterval, zone: string, date: string): { start: string; end: string } {
  const end = localTime(new Date(span.endMs).toISOString(), zone)
  return { start: localTime(new Date(span.startMs).toISOString(), zone), end: span.endMs >= Date.parse(localDayRange(date, zone).toUtc) ? '24:00' : end }
}

/** What the move would do, read on `db` (the transaction's, on a save): 400/409 when it cannot be done. */
async function planMove(db: Db, user: SessionUser, input: RotaMoveInput): Promise<RotaMovePlan> {
  requireSiteAccess(user, input.fromSiteId)
  requireSiteAccess(user, input.toSiteId)
  const provider = await findProvider(db, input.providerId)
  if (!provider || !provider.active) throw badRequest('providerId', 'is not an active provider')
  const [from, to] = await Promise.all([loadSiteCalendar(db, input.fromSiteId), loadSiteCalendar(db, input.toSiteId)])
  if (!from) throw badRequest('fromSiteId', 'is not a site')
  if (!to) throw badRequest('toSiteId', 'is not a site')
  const sites = await findSiteDetails(db, [input.fromSiteId, input.toSiteId])
  const nameOf = (siteId: number) => sites.find((site) => site.id === siteId)?.name ?? `site ${siteId}`
  if (input.date < todayIn(from.site.timeZone, scheduleNowMs())) throw badRequest('date', `must be today or later at ${nameOf(input.fromSiteId)}`)
  const dateText = formatLocalDate(input.date, displayStyleOf(sites.find((site) => site.id === input.fromSiteId)), 'medium')
  for (const siteId of [input.fromSiteId, input.toSiteId]) {
    if (!provider.siteIds.includes(siteId)) throw badRequest('providerId', `${provider.name}'s account does not include ${nameOf(siteId)}: add the site to their account under People first`)
  }
  const worked = shiftSpanOn(from, input.providerId, input.date)
  if (!worked) throw conflict(`${provider.name} is not on shift at ${nameOf(input.fromSiteId)} on ${dateText}: there is no day to move.`, { field: 'date' })
  if (shiftSpanOn(to, input.providerId, input.date)) throw conflict(`${provider.name} is already on shift at ${nameOf(input.toSiteId)} on ${dateText}.`, { field: 'toSiteId' })
  const hours = receivingHoursAt(to, input.date, worked)
  if (!hours) throw conflict(`${nameOf(input.toSiteId)} is closed on ${dateText}, or not open during ${provider.name}'s hours at ${nameOf(input.fromSiteId)}.`, { field: 'toSiteId' })
  const fromClock = clockSpan(worked, from.site.timeZone, input.date)
  return {
    providerId: provider.id, providerName: provider.name, date: input.date,
    fromSiteId: input.fromSiteId, fromSiteName: nameOf(input.fromSiteId), fromLocalStart: fromClock.start, fromLocalEnd: fromClock.end,
    toSiteId: input.toSiteId, toSiteName: nameOf(input.toSiteId), toLocalStart: hours.localStart, toLocalEnd: hours.localEnd,
    startUtc: new Date(hours.startMs).toISOString(), endUtc: new Date(hours.endMs).toISOString(),
  }
}

/**
 * Preview or save the whole move. Both rota changes run inside one `changeWithImpact` transaction, so
 * the preview lists every visit the move strands and a save writes both changes or neither.
 */
export async function moveRotaDay(user: SessionUser, input: RotaMoveInput, dryRun: boolean): Promise<RotaMoveAnswer> {
  // Planned before the transaction for the preview's answer (a dry run's transaction answers only the
  // stranded visits), and again inside it on a save, so what is written is what the locked rows say.
  const move = await planMove(useDb(), user, input)
  const result = await changeWithImpact({ userId: user.id, dryRun, cause: 'rota day moved' }, async (trx, impact) => {
    const planned = await planMove(trx, user, input)
    const timeOff = await addShiftException(trx, impact, user, {
      providerId: input.providerId, kind: 'time_off', siteId: input.fromSiteId, startDate: input.date, endDate: input.date,
      localStart: null, localEnd: null, reason: `Balance: a day at ${planned.toSiteName}`,
    })
    const extra = await addShiftException(trx, impact, user, {
      providerId: input.providerId, kind: 'extra', siteId: input.toSiteId, startDate: input.date, endDate: input.date,
      localStart: planned.toLocalStart, localEnd: planned.toLocalEnd, reason: `Balance: from ${planned.fromSiteName}`,
    })
    return { planned, timeOffId: timeOff.id, extraId: extra.id }
  })
  if (result.dryRun) return { dryRun: true, move, strandedVisits: result.strandedVisits }
  return { dryRun: false, move: result.saved.planned, strandedVisits: result.strandedVisits, timeOffId: result.saved.timeOffId, extraId: result.saved.extraId }
}
