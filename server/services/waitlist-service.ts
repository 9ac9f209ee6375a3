// The waitlist (issue 17 §2): entries, matching a freed gap against them with the openings engine,
// and closing an entry when its patient is booked. Offers are in offer-service.ts.
import type { SessionUser } from '#shared/types/auth'
import type { BookingUnitMinutes } from '#shared/types/chair-time'
import type { StoredTemplate } from '#shared/types/templates'
import type { Opening, OpeningsSite } from '#shared/types/openings'
import type { FreedWindowDto, WaitlistEntryDto, WaitlistMatchDto, WaitlistMatchesDto, WaitlistState } from '#shared/types/waitlist'
import type { NewWaitlistEntryInput, WaitlistGapQuery } from '#shared/schemas/waitlist'
import type { ChairTimeRequest } from '#shared/schemas/templates'
import { expandAvailabilityMs } from '#shared/domain/rota'
import { matchWaitlist, openingsInGap, type FreedGap, type WaitlistCandidate } from '#shared/domain/waitlist-match'
import { addedProviderTime } from '#shared/domain/freed-time'
import { localDateAt, localIsoAt } from '#shared/utils/local-date'
import { useDb, type Db } from '../utils/db'
import { badRequest, conflict, notFound } from '../utils/errors'
import { requireSiteAccess } from '../utils/auth'
import { inTransaction } from '../utils/db-retry'
import { scheduleNowMs } from '../utils/clock'
import { loadSiteCalendar, providerIdsAtSite, type SiteCalendarInputs } from '../repositories/site-calendar'
import { busySegments, providersByIds, type ProviderRow } from '../repositories/openings-inputs'
import { findPatient } from '../repositories/patients'
import { findVisitRow } from '../repositories/visits'
import { writeAudit } from '../repositories/audit-log'
import { offerChannels } from './sms/channels'
import { closeEntry, entriesOfferedAt, findEntry, insertEntry, listEntries, openEntriesForSite } from '../repositories/waitlist'
import { planItems, type ResolvedPlan } from './plan-service'

const HOUR_MS = 3_600_000

export async function addWaitlistEntry(input: NewWaitlistEntryInput, user: SessionUser): Promise<WaitlistEntryDto> {
  requireSiteAccess(user, input.siteId)
  const siteIds = [...new Set(input.siteIds ?? [input.siteId])]
  for (const siteId of siteIds) requireSiteAccess(user, siteId)
  return inTransaction(async (trx) => {
    if (!(await findPatient(trx, input.patientId))) throw badRequest('patientId', 'no such patient')
    const calendar = await loadSiteCalendar(trx, input.siteId)
    if (!calendar) throw badRequest('siteId', 'no such site')
    // The plan must be one the drawer could book (a 400 naming the item otherwise).
    await planItems(trx, input.items, calendar.bookingUnitMinutes as BookingUnitMinutes)
    const id = await insertEntry(trx, { ...input, siteIds }, user.id)
    await writeAudit(trx, { userId: user.id, action: 'waitlist_entry_added', entity: 'waitlist_entry', entityId: id, after: { ...input, siteIds } })
    return (await findEntry(trx, id))!
  })
}

export async function listWaitlist(siteId: number, state: WaitlistState | 'all', user: SessionUser): Promise<WaitlistEntryDto[]> {
  requireSiteAccess(user, siteId)
  return listEntries(useDb(), siteId, state)
}

export async function closeWaitlistEntry(id: number, reason: string, user: SessionUser): Promise<WaitlistEntryDto> {
  return inTransaction(async (trx) => {
    const entry = await findEntry(trx, id, true)
    if (!entry) throw notFound('No such waitlist entry.')
    requireSiteAccess(user, entry.siteId)
    if (entry.state !== 'open') throw conflict(`This waitlist entry is already ${entry.state}.`, { field: 'state' })
    await closeEntry(trx, id, 'closed', { reason })
    await writeAudit(trx, { userId: user.id, action: 'waitlist_entry_closed', entity: 'waitlist_entry', entityId: id, before: { state: 'open' }, after: { state: 'closed', reason } })
    return (await findEntry(trx, id))!
  })
}

/** Same procedures: every item of the entry is among the booked visit's templates (by id or code). */
function samePlan(entry: WaitlistEntryDto, templates: readonly StoredTemplate[]): boolean {
  return entry.items.every((item) => templates.some((template) => (item.templateId !== undefined ? template.id === item.templateId : template.code === item.templateCode?.toUpperCase())))
}

/**
 * Inside a booking transaction: the patient's open entries for the same procedures are closed as
 * booked (whoever booked, the front desk or the patient through an offer). `openEntryIds` are the
 * patient's open entries as the booking read them with the patient (findBookingParties), after locking the patient.
 */
export async function closeWaitlistOnBooking(trx: Db, openEntryIds: readonly number[], visitId: number, templates: readonly StoredTemplate[], userId: number | null): Promise<void> {
  for (const entryId of openEntryIds) {
    const entry = await findEntry(trx, entryId)
    if (!entry || !samePlan(entry, templates)) continue
    if (await closeEntry(trx, entryId, 'booked', { visitId })) {
      await writeAudit(trx, { userId, action: 'waitlist_entry_booked', entity: 'waitlist_entry', entityId: entryId, before: { state: 'open' }, after: { state: 'booked', visitId } })
    }
  }
}

// ---------------------------------------------------------------- matching a freed gap

interface GapContext {
  gap: FreedGap
  calendar: SiteCalendarInputs
  providers: ProviderRow[]
  site: OpeningsSite
}

type NamedGap = { siteId: number; operatoryId: number | null; startMs: number; endMs: number }

/**
 * The freed gap named by a cancelled or missed visit, or by site, chair and times (a move's old slot, a
 * shortened visit's tail: `freedByChange`), or by site and times alone (a new shift or extra day: every chair).
 */
export async function gapOf(db: Db, query: WaitlistGapQuery, user: SessionUser): Promise<NamedGap> {
  if (query.visitId !== undefined) {
    const visit = await findVisitRow(db, query.visitId)
    if (!visit) throw notFound('No such visit.')
    requireSiteAccess(user, visit.site_id)
    if (visit.state !== 'cancelled' && visit.state !== 'missed') throw conflict('This visit still holds its time: only a cancelled visit or one marked did not come frees it.', { field: 'visitId' })
    return { siteId: visit.site_id, operatoryId: visit.operatory_id, startMs: visit.start_utc.getTime(), endMs: visit.end_utc.getTime() }
  }
  requireSiteAccess(user, query.siteId!)
  return { siteId: query.siteId!, operatoryId: query.operatoryId ?? null, startMs: Date.parse(query.startUtc!), endMs: Date.parse(query.endUtc!) }
}

async function gapContext(db: Db, named: NamedGap): Promise<GapContext> {
  const calendar = await loadSiteCalendar(db, named.siteId)
  if (!calendar) throw badRequest('siteId', 'no such site')
  if (named.operatoryId !== null && !calendar.operatoryDetails.some((room) => room.id === named.operatoryId)) throw badRequest('operatoryId', 'no such chair at this site')
  const providerIds = providerIdsAtSite(calendar)
  const providers = await providersByIds(db, providerIds)
  // Availability and busy time around the gap: a plan longer than the gap may use free time after it.
  const fromMs = named.startMs - 12 * HOUR_MS
  const toMs = named.endMs + 12 * HOUR_MS
  const site: OpeningsSite = {
    id: named.siteId, timeZone: calendar.site.timeZone, bookingUnitMinutes: calendar.bookingUnitMinutes as BookingUnitMinutes,
    operatories: calendar.operatoryDetails.map((room) => ({ id: room.id, siteId: named.siteId, active: room.active, capabilities: room.capabilities })),
    providers: providers.map((provider) => ({ id: provider.id, categories: provider.categories })),
    availability: expandAvailabilityMs({ ...calendar, fromUtc: new Date(fromMs).toISOString(), toUtc: new Date(toMs).toISOString() }),
  }
  return { gap: { ...named, timeZone: calendar.site.timeZone }, calendar, providers, site }
}

type Busy = Awaited<ReturnType<typeof busySegments>>

async function gapBusy(db: Db, ctx: GapContext): Promise<Busy> {
  return busySegments(db, ctx.site.operatories.map((room) => room.id), ctx.site.providers.map((provider) => provider.id), ctx.gap.startMs - 12 * HOUR_MS, ctx.gap.endMs + 12 * HOUR_MS)
}

/** Every start of a plan inside the gap (the engine restricted to its chair and window), or null when the plan cannot be made. */
async function openingsOfPlan(db: Db, ctx: GapContext, busy: Busy, items: ChairTimeRequest['items'], nowMs: number): Promise<{ resolved: ResolvedPlan; openings: Opening[] } | null> {
  let resolved: ResolvedPlan
  try {
    resolved = await planItems(db, items, ctx.calendar.bookingUnitMinutes as BookingUnitMinutes)
  } catch {
    return null
  }
  const first = resolved.templates[0]!
  return {
    resolved,
    openings: openingsInGap({
      plan: resolved.plan, capability: first.capability, category: first.category, sites: [ctx.site], busy, nowMs, minimumNoticeMinutes: ctx.calendar.minimumNoticeMinutes,
    }, ctx.gap),
  }
}

/**
 * For Balance's recall suggestions: every start of each plan inside a named gap (its chair and window),
 * the same restricted engine search the waitlist matching makes, with the providers' names. Plans
 * that cannot be made are left out.
 */
export async function planOpeningsInGap(db: Db, named: NamedGap, plans: ReadonlyArray<ChairTimeRequest['items']>): Promise<{ providers: ProviderRow[]; found: Array<{ resolved: ResolvedPlan; openings: Opening[] } | null> }> {
  const ctx = await gapContext(db, named)
  const busy = await gapBusy(db, ctx)
  const nowMs = scheduleNowMs()
  const found: Array<{ resolved: ResolvedPlan; openings: Opening[] } | null> = []
  for (const items of plans) found.push(await openingsOfPlan(db, ctx, busy, items, nowMs))
  return { providers: ctx.providers, found }
}

/** Entries that fit the gap, ranked, with the earliest start each can take. */
async function matchesIn(db: Db, ctx: GapContext, onlyEntryIds?: ReadonlySet<number>): Promise<Array<{ entry: WaitlistEntryDto; opening: Opening }>> {
  const { gap } = ctx
  const entries = (await openEntriesForSite(db, gap.siteId, localDateAt(gap.startMs, gap.timeZone), localDateAt(gap.endMs - 1, gap.timeZone)))
    .filter((entry) => !onlyEntryIds || onlyEntryIds.has(entry.id))
  if (!entries.length) return []
  const busy = await gapBusy(db, ctx)
  const nowMs = scheduleNowMs()
  const openingsByPlan = new Map<string, Opening[]>()
  for (const planKey of new Set(entries.map((entry) => JSON.stringify(entry.items)))) {
    // A template taken out of use since: the entry no longer fits anything.
    const found = await openingsOfPlan(db, ctx, busy, JSON.parse(planKey), nowMs)
    if (found) openingsByPlan.set(planKey, found.openings)
  }
  const candidates: WaitlistCandidate[] = entries.map((entry) => ({
    id: entry.id, siteIds: entry.siteIds, fromDate: entry.from, toDate: entry.to, partOfDay: entry.partOfDay, noticeMinutes: entry.noticeMinutes,
    priority: entry.priority, createdAtMs: Date.parse(entry.createdAtUtc), planKey: JSON.stringify(entry.items),
  }))
  const byId = new Map(entries.map((entry) => [entry.id, entry]))
  return matchWaitlist({ gap, entries: candidates, openingsByPlan, nowMs }).map((match) => ({ entry: byId.get(match.entryId)!, opening: match.opening }))
}

/** For offer-service: the gap's context and its matches among some entries. */
export async function matchesForOffers(db: Db, named: NamedGap, entryIds: ReadonlySet<number>) {
  const ctx = await gapContext(db, named)
  return { ctx, matches: await matchesIn(db, ctx, entryIds) }
}

export async function waitlistMatches(query: WaitlistGapQuery, user: SessionUser): Promise<WaitlistMatchesDto> {
  const db = useDb()
  const ctx = await gapContext(db, await gapOf(db, query, user))
  const { gap } = ctx
  const matches = await matchesIn(db, ctx)
  const offered = await entriesOfferedAt(db, gap.siteId, gap.operatoryId, gap.startMs, gap.endMs)
  const names = new Map(ctx.providers.map((provider) => [provider.id, provider.name]))
  const rows: WaitlistMatchDto[] = []
  for (const { entry, opening } of matches) {
    // The channels an offer would go by now (the same choice as sending: e-mail and/or text).
    const { channels } = await offerChannels(db, 'offer', entry.patientId, ctx.calendar.settings, localDateAt(opening.startMs, gap.timeZone))
    rows.push({
      entry, siteId: opening.siteId, operatoryId: opening.operatoryId, providerId: opening.providerId, providerName: names.get(opening.providerId) ?? '',
      startUtc: new Date(opening.startMs).toISOString(), endUtc: new Date(opening.endMs).toISOString(), startLocalIso: localIsoAt(opening.startMs, gap.timeZone),
      canOffer: channels.length > 0, channels, offered: offered.has(entry.id), offeredBy: offered.get(entry.id) ?? [],
    })
  }
  return {
    gap: { siteId: gap.siteId, operatoryId: gap.operatoryId, startUtc: new Date(gap.startMs).toISOString(), endUtc: new Date(gap.endMs).toISOString() },
    matches: rows,
  }
}

// ---------------------------------------------------------------- time a new shift or extra day adds

const FREED_LOOKAHEAD_MS = 14 * 24 * HOUR_MS

/**
 * After a new shift or extra day is saved: the provider time it adds at the site in the next 14 days
 * (their time with it minus without it), as gaps across the site's chairs for the waitlist.
 */
export async function freedByNewProviderTime(siteId: number, providerId: number, added: { shiftId?: number; exceptionId?: number }): Promise<FreedWindowDto[]> {
  const db = useDb()
  const calendar = await loadSiteCalendar(db, siteId)
  if (!calendar) return []
  const nowMs = scheduleNowMs()
  const range = { fromUtc: new Date(nowMs).toISOString(), toUtc: new Date(nowMs + FREED_LOOKAHEAD_MS).toISOString() }
  const timeOf = (input: SiteCalendarInputs) => expandAvailabilityMs({ ...input, ...range }).providers.find((entry) => entry.providerId === providerId)?.intervals ?? []
  const without = {
    ...calendar,
    shifts: calendar.shifts.filter((shift) => shift.id !== added.shiftId),
    exceptions: calendar.exceptions.filter((exception) => exception.id !== added.exceptionId),
  }
  return addedProviderTime(timeOf(calendar), timeOf(without))
    .map((piece) => ({ siteId, startUtc: new Date(piece.startMs).toISOString(), endUtc: new Date(piece.endMs).toISOString() }))
}
