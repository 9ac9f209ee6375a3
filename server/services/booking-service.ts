// Booking, moving, re-planning, state changes and cancellation: each one MariaDB transaction at
// READ COMMITTED that locks the rooms and providers involved, re-checks every conflict, writes the
// visit, its segments, an audit row and the patient's outbox e-mail, then commits.
import { createHash, randomUUID } from 'node:crypto'
import type { SessionUser } from '#shared/types/auth'
import type { VisitDto, PatientDto } from '#shared/types/visits'
import type { BookingUnitMinutes, VisitPlan } from '#shared/types/chair-time'
import type { BookVisitInput, MoveVisitInput } from '#shared/schemas/visits'
import { holdsTime, VISIT_STATE_LABELS, type VisitState } from '#shared/domain/visit-states'
import { mayChangeState, mayRebook, mayRecordAnaesthetic, type Verdict } from '#shared/domain/visit-access'
import { mayUndo, undoRetakesTime, undoTarget } from '#shared/domain/visit-undo'
import { mayGiveAnaesthetic } from '#shared/domain/numbing-clock'
import { withChairMinutes } from '#shared/domain/length-override'
import { isProviderRole } from '#shared/utils/access'
import { displayStyleOf } from '#shared/utils/display-time'
import { useDb, type Db } from '../utils/db'
import { badRequest, conflict, isDuplicateKey, notFound, rethrowDomainError } from '../utils/errors'
import { requireSiteAccess } from '../utils/auth'
import { inTransaction } from '../utils/db-retry'
import { loadSiteCalendar, siteCalendarStatement, type SiteCalendarInputs } from '../repositories/site-calendar'
import { findVisit, findVisitRow, insertVisitStatement, newSegmentsStatement, newVisitDto, replaceSegments, updateVisitIfVersion, type VisitRow } from '../repositories/visits'
import { lockForBooking, lockStatement } from '../repositories/booking-locks'
import { claimKey, findAnswer, storeAnswer } from '../repositories/idempotency'
import { enqueueMessages, enqueueStatement, type NewOutboxMessage } from '../repositories/outbox'
import { inOneTrip } from '../repositories/round-trip'
import { bookingPartiesStatement } from '../repositories/booking-parties'
import { dropQueuedReminders, reminderMessages } from './mail/reminders'
import { seenChange, seenVisitOf, type SeenVisit } from '#shared/domain/patient-time'
import { mailSettingsOf } from '#shared/domain/site-settings'
import { onChannels, textReachFrom, type TextReach } from './sms/channels'
import { findTextSite } from '../repositories/sms'
import { auditStatement, writeAudit } from '../repositories/audit-log'
import { findProviderIdOfUser } from '../repositories/providers'
import { findSite } from '../repositories/sites'
import { scheduleNowMs } from '../utils/clock'
import { findTemplateByCode } from '../repositories/templates'
import { parseJson } from '../repositories/json'
import { planFromTemplates, planItems, planTemplateStatement } from './plan-service'
import { assertBookable, assertStartAllowed, placeSegments, visitEnd } from './booking-rules'
import { dropStranded, settleStranded } from './impact-service'
import { closeWaitlistOnBooking } from './waitlist-service'
import { markRecallsOnBooking, setRecallOnFinish } from './recall-service'

// Every transaction here runs at READ COMMITTED: db/connection.ts makes that each connection's default.

/** The site's calendar read inside a booking transaction (see loadSiteCalendar's forBooking). */
async function bookingCalendar(trx: Db, siteId: number): Promise<SiteCalendarInputs> {
  const calendar = await loadSiteCalendar(trx, siteId, { forBooking: true })
  if (!calendar) throw badRequest('siteId', 'no such site')
  return calendar
}

function startOf(startUtc: string): number {
  return new Date(startUtc).getTime()
}

interface VisitMail {
  visitId: number
  startMs: number
  calendar: SiteCalendarInputs
  patient: PatientDto | undefined
  /** The patient's channels when the booking read their row already (see assertBookable). */
  reach?: TextReach
  /** Updates: what the patient sees, before and after; no update is sent when none of it changed. */
  seen?: { before: SeenVisit; after: SeenVisit }
}

/** The patient's invitation or update and the visit's reminders, in one insert, on each channel the
 * site uses for them and the patient can take (e-mail, text; the dispatcher checks again at send time). */
async function queueVisitMail(db: Db, kind: 'invitation' | 'update', visit: VisitMail): Promise<void> {
  await enqueueMessages(db, await visitMailMessages(db, kind, visit))
}

async function visitMailMessages(db: Db, kind: 'invitation' | 'update', visit: VisitMail): Promise<NewOutboxMessage[]> {
  // A change the patient cannot see (the chair, the provider, the room reset after they leave) sends
  // nothing, and the reminders planned for the same start stay.
  const change = visit.seen ? seenChange(visit.seen.before, visit.seen.after) : undefined
  if (kind === 'update' && change === null) return []
  // Reminders not yet sent belong to the old time: planned again below.
  if (kind === 'update') await dropQueuedReminders(db, visit.visitId)
  const site = { id: visit.calendar.site.id, timeZone: visit.calendar.site.timeZone, settings: visit.calendar.settings }
  const payload = change && visit.seen ? { visitId: visit.visitId, change: { ...change, minutesBefore: visit.seen.before.minutes } } : { visitId: visit.visitId }
  return onChannels(db, visit.patient?.id, site.settings, [
    { kind, visitId: visit.visitId, siteId: site.id, dueAt: new Date(), payload },
    ...reminderMessages({ visitId: visit.visitId, startMs: visit.startMs, site }),
  ], visit.reach)
}

async function queueCancellationMail(db: Db, row: VisitRow): Promise<void> {
  await dropQueuedReminders(db, row.id)
  const settings = (await findTextSite(db, row.site_id))?.settings ?? {}
  await enqueueMessages(db, await onChannels(db, row.patient_id, settings, [{ kind: 'cancellation', visitId: row.id, siteId: row.site_id, dueAt: new Date(), payload: { visitId: row.id } }]))
}

async function loaded(db: Db, id: number): Promise<VisitDto> {
  const visit = await findVisit(db, id)
  if (!visit) throw notFound('No such visit.')
  return visit
}

export async function bookVisit(input: BookVisitInput, user: SessionUser, idempotencyKey?: string): Promise<VisitDto> {
  requireSiteAccess(user, input.siteId)
  const db = useDb()
  const requestHash = createHash('sha256').update(JSON.stringify(input)).digest('hex')
  if (idempotencyKey) {
    const prior = await findAnswer<VisitDto>(db, user.id, idempotencyKey)
    if (prior?.response) return replayed(prior.requestHash, requestHash, prior.response)
  }
  try {
    return await inTransaction(async (trx) => {
      // Claimed first: a concurrent request with the same key waits here, then replays our answer.
      if (idempotencyKey) await claimKey(trx, user.id, idempotencyKey, requestHash)
      const visit = await bookInTransaction(trx, input, user.id)
      if (idempotencyKey) await storeAnswer(trx, user.id, idempotencyKey, 201, visit, visit.id)
      return visit
    })
  } catch (error) {
    // Another request with the same key committed first: answer what it answered.
    if (idempotencyKey && isDuplicateKey(error)) {
      const prior = await findAnswer<VisitDto>(db, user.id, idempotencyKey)
      if (prior?.response) return replayed(prior.requestHash, requestHash, prior.response)
    }
    throw error
  }
}

/**
 * The booking itself, inside the caller's transaction: locks, checks, the visit, its segments, the
 * audit row and the patient's mail. Staff bookings (`bookVisit`) and an accepted waitlist offer
 * (offer-service.ts, `userId` null: the patient) both come through here, so two at the same moment
 * give one visit and one 409.
 */
export async function bookInTransaction(trx: Db, input: BookVisitInput, userId: number | null): Promise<VisitDto> {
  const startMs = startOf(input.startUtc)
  // One round trip: the locks first, then what the checks read (issue 19 §3).
  const [, calendar, found, parties] = await inOneTrip(trx, [
    lockStatement(trx, [input.operatoryId], [input.providerId], input.patientId),
    siteCalendarStatement(trx, input.siteId, { forBooking: true }),
    planTemplateStatement(trx, input.items),
    bookingPartiesStatement(trx, input.providerId, input.patientId),
  ])
  if (!calendar) throw badRequest('siteId', 'no such site')
  const { plan, templates } = planFromTemplates(input.items, found, calendar.bookingUnitMinutes as BookingUnitMinutes)
  assertStartAllowed(startMs, calendar)
  const newVisit = {
    siteId: input.siteId, operatoryId: input.operatoryId, providerId: input.providerId, patientId: input.patientId,
    startMs, endMs: visitEnd(plan, startMs), plan, note: input.note, icalUid: `${randomUUID()}@cuspline`, userId,
  }
  // The clash check and the visit's insert in one round trip (a clash throws and rolls the insert back).
  const { patient, textPatient, openWaitlistEntryIds, along: id } = await assertBookable(trx, {
    calendar, plan, templates, operatoryId: input.operatoryId, providerId: input.providerId, patientId: input.patientId, startMs, exceptVisitId: null, parties,
  }, insertVisitStatement(trx, newVisit))
  const segments = placeSegments(plan, startMs, input.operatoryId, input.providerId)
  const messages = await visitMailMessages(trx, 'invitation', { visitId: id, startMs, calendar, patient, reach: textReachFrom(textPatient) })
  // One round trip: the segments, the audit row and the patient's messages.
  await inOneTrip(trx, [
    newSegmentsStatement(trx, id, segments),
    auditStatement(trx, { userId, action: 'visit_booked', entity: 'visit', entityId: id, after: input }),
    enqueueStatement(trx, messages),
  ])
  await closeWaitlistOnBooking(trx, openWaitlistEntryIds, id, templates, userId)
  await markRecallsOnBooking(trx, input.patientId, id, templates)
  return newVisitDto(id, newVisit, segments)
}

function replayed(storedHash: string, requestHash: string, response: VisitDto): VisitDto {
  if (storedHash !== requestHash) {
    throw conflict('This Idempotency-Key was already used for a different booking request.', { field: 'Idempotency-Key' })
  }
  return response
}

async function liveVisit(db: Db, id: number, user: SessionUser): Promise<VisitRow> {
  const row = await findVisitRow(db, id)
  if (!row) throw notFound('No such visit.')
  requireSiteAccess(user, row.site_id)
  return row
}

/** The signed-in user as the visit rules see them: role, sites and their own provider record. */
async function actorOf(db: Db, user: SessionUser) {
  const isProvider = isProviderRole(user.role)
  return { ...user, providerId: isProvider ? await findProviderIdOfUser(db, user.id) : null }
}

/** A refusal from shared/domain/visit-access.ts as an HTTP error: 403 for who, 409 for state or time. */
function enforce(verdict: Verdict, data: Record<string, unknown>): void {
  if (verdict.allowed) return
  if (verdict.status === 403) throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: verdict.reason })
  throw conflict(verdict.reason, data)
}

function staleVersion() {
  return conflict('Someone changed this visit since you opened it. Reload to see the latest version.', { field: 'rowVersion' })
}

/** The stored plan, unless new items were given: template edits never change a booked visit. */
async function planForMove(db: Db, row: VisitRow, input: MoveVisitInput, calendar: SiteCalendarInputs) {
  if (input.items) return planItems(db, input.items, calendar.bookingUnitMinutes as BookingUnitMinutes)
  return storedPlan(db, row)
}

/** The plan the visit was booked with, and the template versions behind it. */
async function storedPlan(db: Db, row: VisitRow) {
  const plan = parseJson<VisitPlan>(row.plan, {} as VisitPlan)
  const templates = (await Promise.all((plan.items ?? []).map((item) => findTemplateByCode(db, item.templateCode, item.templateVersion))))
    .filter((template) => template !== undefined)
  return { plan, templates }
}

export async function moveVisit(id: number, input: MoveVisitInput, user: SessionUser): Promise<VisitDto> {
  const db = useDb()
  const row = await liveVisit(db, id, user)
  const actor = await actorOf(db, user)
  enforce(mayRebook(actor, { siteId: row.site_id, state: row.state }), { field: 'state' })
  const siteId = input.siteId ?? row.site_id
  if (siteId !== row.site_id) {
    // To another site (a stranded visit rebooked from the Rebook list): the caller books there too.
    requireSiteAccess(user, siteId)
    enforce(mayRebook(actor, { siteId, state: row.state }), { field: 'siteId' })
    if (input.operatoryId === undefined) throw badRequest('operatoryId', 'is required when the visit moves to another site')
    if (input.providerId === undefined) throw badRequest('providerId', 'is required when the visit moves to another site')
  }
  if (row.row_version !== input.rowVersion) throw staleVersion()
  return inTransaction((trx) => moveInTransaction(trx, row, input, user.id))
}

/**
 * The one move: locks, booking checks (overlaps, hours, shifts), the version check, segments, audit
 * `visit_moved` and the patient's change mail, inside the caller's transaction. Staff moves come
 * through `moveVisit`; a patient accepting a move offer comes here with `userId` null.
 */
export async function moveInTransaction(trx: Db, row: VisitRow, input: MoveVisitInput, userId: number | null): Promise<VisitDto> {
  const siteId = input.siteId ?? row.site_id
  const id = row.id
  const startMs = input.startUtc ? startOf(input.startUtc) : row.start_utc.getTime()
  const operatoryId = input.operatoryId ?? row.operatory_id
  const providerId = input.providerId ?? row.provider_id
  await lockForBooking(trx, [operatoryId], [providerId], row.patient_id)
  const calendar = await bookingCalendar(trx, siteId)
  const planned = await planForMove(trx, row, input, calendar)
  const plan = input.lengthOverride ? withLength(planned.plan, input.lengthOverride) : planned.plan
  if (input.startUtc) assertStartAllowed(startMs, calendar)
  const { patient } = await assertBookable(trx, { calendar, plan, templates: planned.templates, operatoryId, providerId, patientId: row.patient_id, startMs, exceptVisitId: id })
  const changed = await updateVisitIfVersion(trx, id, input.rowVersion, {
    site_id: siteId, operatory_id: operatoryId, provider_id: providerId, start_utc: new Date(startMs), end_utc: new Date(visitEnd(plan, startMs)),
    plan: JSON.stringify(plan), ical_sequence: row.ical_sequence + 1, updated_by: userId, ...(input.note === undefined ? {} : { note: input.note }),
  })
  if (!changed) throw staleVersion()
  await replaceSegments(trx, id, placeSegments(plan, startMs, operatoryId, providerId))
  // A stranded visit moved to a time that holds leaves the Rebook list.
  if (row.stranded_reason) await settleStranded(trx, id, userId)
  await writeAudit(trx, { userId, action: 'visit_moved', entity: 'visit', entityId: id, before: { start: row.start_utc, siteId: row.site_id, operatoryId: row.operatory_id, providerId: row.provider_id }, after: input })
  const namesShown = mailSettingsOf(calendar.settings).includeProcedureNames
  const seen = {
    before: seenVisitOf(parseJson<VisitPlan>(row.plan, {} as VisitPlan), row.start_utc.getTime(), row.end_utc.getTime(), namesShown),
    after: seenVisitOf(plan, startMs, visitEnd(plan, startMs), namesShown),
  }
  // A visit taken off the Rebook list is always announced (issue 13 §2), even when only its provider
  // changed: the patient hears that it holds again. Otherwise only what the patient sees (issue 15).
  await queueVisitMail(trx, 'update', { visitId: id, startMs, calendar, patient, ...(row.stranded_reason ? {} : { seen }) })
  return loaded(trx, id)
}

function withLength(plan: VisitPlan, override: NonNullable<MoveVisitInput['lengthOverride']>): VisitPlan {
  try {
    return withChairMinutes(plan, override.chairMinutes, override.reason)
  } catch (error) {
    rethrowDomainError(error)
  }
}

export async function changeVisitState(id: number, to: VisitState, user: SessionUser, reason?: string, seenVersion?: number): Promise<VisitDto> {
  return inTransaction(async (trx) => {
    const row = await liveVisit(trx, id, user)
    const site = await findSite(trx, row.site_id)
    const visit = { siteId: row.site_id, providerId: row.provider_id, state: row.state, startUtc: row.start_utc.toISOString(), ...displayStyleOf(site) }
    enforce(mayChangeState(await actorOf(trx, user), visit, to, scheduleNowMs()), { field: 'state', from: row.state, to })
    if (seenVersion !== undefined && seenVersion !== row.row_version) throw staleVersion()
    const releases = !holdsTime(to)
    const changed = await updateVisitIfVersion(trx, id, row.row_version, {
      state: to, updated_by: user.id, previous_state: row.state, state_changed_at: new Date(scheduleNowMs()),
      ...(to === 'cancelled' ? { cancel_reason: reason ?? '', ical_sequence: row.ical_sequence + 1 } : {}),
    })
    if (!changed) throw staleVersion()
    // A cancelled or missed visit gives its chair and provider back.
    if (releases) await replaceSegments(trx, id, [])
    if (releases && row.stranded_reason) await dropStranded(trx, id, user.id, to)
    await writeAudit(trx, { userId: user.id, action: `visit_${to}`, entity: 'visit', entityId: id, before: { state: row.state }, after: { state: to, reason } })
    if (to === 'cancelled') await queueCancellationMail(trx, row)
    // A finished cleaning or exam sets the patient's next recall due date (issue 17 §1).
    if (to === 'finished') {
      const { templates } = await storedPlan(trx, row)
      await setRecallOnFinish(trx, { id, patientId: row.patient_id, siteId: row.site_id, startMs: row.start_utc.getTime(), timeZone: site?.timeZone ?? 'UTC' }, templates, user.id)
    }
    return loaded(trx, id)
  })
}

/** A 409 from the booking checks, said as the reason an undo cannot take the time back. */
function slotTaken(error: unknown): never {
  if (isError(error) && error.statusCode === 409) {
    throw conflict(`The visit's time is no longer free, so this cannot be undone: ${error.message}`, { ...(error.data as Record<string, unknown> | undefined), field: 'state' })
  }
  throw error
}

/**
 * Undo the visit's last state change (issue 13 §3): back to the state before it, by the same roles,
 * on the site-local day the change was made (shared/domain/visit-undo.ts). A visit that gave its time
 * back (did not come, cancelled) takes it again only while its chair, provider and patient are still
 * free, checked here after the booking locks exactly as a booking is; an undone cancellation gets its
 * segments back and the patient a fresh invitation.
 */
export async function undoVisitState(id: number, seenVersion: number, user: SessionUser): Promise<VisitDto> {
  return inTransaction(async (trx) => {
    const row = await liveVisit(trx, id, user)
    const site = await findSite(trx, row.site_id)
    const facts = {
      siteId: row.site_id, providerId: row.provider_id, state: row.state, previousState: row.previous_state ?? null,
      stateChangedAt: row.state_changed_at ? row.state_changed_at.toISOString() : null, timeZone: site?.timeZone ?? 'UTC',
    }
    enforce(mayUndo(await actorOf(trx, user), facts, scheduleNowMs()), { field: 'state', state: row.state })
    if (seenVersion !== row.row_version) throw staleVersion()
    const to = undoTarget(facts)!
    const retakes = undoRetakesTime(facts)
    const startMs = row.start_utc.getTime()
    let calendar: SiteCalendarInputs | null = null
    let patient: PatientDto | undefined
    if (retakes) {
      await lockForBooking(trx, [row.operatory_id], [row.provider_id], row.patient_id)
      calendar = await bookingCalendar(trx, row.site_id)
      const { plan, templates } = await storedPlan(trx, row)
      try {
        ({ patient } = await assertBookable(trx, { calendar, plan, templates, operatoryId: row.operatory_id, providerId: row.provider_id, patientId: row.patient_id, startMs, exceptVisitId: id }))
      } catch (error) {
        slotTaken(error)
      }
      await replaceSegments(trx, id, placeSegments(plan, startMs, row.operatory_id, row.provider_id))
    }
    const fromCancelled = row.state === 'cancelled'
    const changed = await updateVisitIfVersion(trx, id, row.row_version, {
      state: to, previous_state: null, state_changed_at: null, updated_by: user.id,
      // Back to before arrival: the patient was not in the chair, so no anaesthetic was given then.
      ...(to === 'booked' || to === 'confirmed' ? { anaesthetic_given_at: null } : {}),
      ...(fromCancelled ? { cancel_reason: null, ical_sequence: row.ical_sequence + 1 } : {}),
    })
    if (!changed) throw staleVersion()
    await writeAudit(trx, { userId: user.id, action: 'visit_state_undone', entity: 'visit', entityId: id, before: { state: row.state }, after: { state: to } })
    if (fromCancelled && calendar) await queueVisitMail(trx, 'invitation', { visitId: id, startMs, calendar, patient })
    return loaded(trx, id)
  })
}

/**
 * "Anaesthetic given" (issue 13 §4): the moment the numbing countdown runs from, recorded once by the
 * visit's provider, an assistant or a manager or admin of the site, on a visit with numbing whose
 * patient is in the chair.
 */
export async function recordAnaesthetic(id: number, seenVersion: number, user: SessionUser): Promise<VisitDto> {
  return inTransaction(async (trx) => {
    const row = await liveVisit(trx, id, user)
    enforce(mayRecordAnaesthetic(await actorOf(trx, user), { siteId: row.site_id, providerId: row.provider_id }), { field: 'anaesthetic' })
    const plan = parseJson<VisitPlan>(row.plan, {} as VisitPlan)
    if (!mayGiveAnaesthetic({ plan, state: row.state })) {
      const why = (plan.anaesthesia ?? []).length === 0
        ? 'This visit has no local anaesthetic planned.'
        : `The patient is not in the chair (the visit is ${VISIT_STATE_LABELS[row.state].toLowerCase()}): the anaesthetic can be recorded once they have arrived.`
      throw conflict(why, { field: 'state', state: row.state })
    }
    if (row.anaesthetic_given_at) throw conflict('The anaesthetic was already recorded for this visit.', { field: 'anaesthetic', anaestheticGivenAt: row.anaesthetic_given_at.toISOString() })
    if (seenVersion !== row.row_version) throw staleVersion()
    const givenAt = new Date(scheduleNowMs())
    if (!(await updateVisitIfVersion(trx, id, row.row_version, { anaesthetic_given_at: givenAt, updated_by: user.id }))) throw staleVersion()
    await writeAudit(trx, { userId: user.id, action: 'visit_anaesthetic_given', entity: 'visit', entityId: id, before: { anaestheticGivenAt: null }, after: { anaestheticGivenAt: givenAt.toISOString() } })
    return loaded(trx, id)
  })
}
