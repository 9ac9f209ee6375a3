// What a patient can do through the signed link in an e-mail, without signing in: see the visit,
// confirm it (booked → confirmed), ask to cancel it (the site decides whether that cancels at once),
// and download the current calendar event. A bad token is 404; an expired one 410.
import type { PublicVisitDto } from '#shared/types/outbox'
import { canMoveToState } from '#shared/domain/visit-states'
import { useDb, type Db } from '../utils/db'
import { conflict, notFound } from '../utils/errors'
import { inTransaction } from '../utils/db-retry'
import { hasValidSignature, readVisitToken } from '../utils/visit-token'
import { useVisitLinkSecret } from '../utils/visit-link-secret'
import { confirmVisit, loadMailContext, recordCancelRequest, type MailContext } from '../repositories/mail-context'
import { replaceSegments, updateVisitIfVersion } from '../repositories/visits'
import { writeAudit } from '../repositories/audit-log'
import { enqueueMessages } from '../repositories/outbox'
import { onChannels } from './sms/channels'
import { visitFacts } from './mail/visit-facts'
import { methodFor, visitCalendar } from './mail/calendar'
import { mailSettingsOf } from '#shared/domain/site-settings'
import { dropQueuedReminders } from './mail/reminders'

const LINK_NOT_FOUND = 'This link is not valid. Please call the practice.'
const PATIENT_CANCEL_REASON = 'Cancelled by the patient through the e-mail link'

function expired() {
  return createError({ statusCode: 410, statusMessage: 'Gone', message: 'This link has expired: the visit is over. Please call the practice.' })
}

/** The visit a token opens, or 404 (malformed, unknown, tampered) / 410 (after the visit). */
export async function visitOfToken(db: Db, token: string, visitId?: number): Promise<MailContext> {
  const parts = readVisitToken(token)
  if (!parts || (visitId !== undefined && parts.visitId !== visitId)) throw notFound(LINK_NOT_FOUND)
  const context = await loadMailContext(db, parts.visitId)
  if (!context || !hasValidSignature(useVisitLinkSecret(), token, context.visit.icalUid)) throw notFound(LINK_NOT_FOUND)
  if (Date.now() > Math.min(parts.expiresAtMs, context.visit.endUtc.getTime())) throw expired()
  return context
}

function toPublicVisit(context: MailContext, token: string): PublicVisitDto {
  const facts = visitFacts(context)
  const { visit, site } = context
  const upcoming = visit.state === 'booked' || visit.state === 'confirmed'
  return {
    siteName: site.name, siteAddress: site.address, sitePhone: site.phone, timeZone: site.timeZone, zoneName: facts.zoneName,
    startUtc: visit.startUtc.toISOString(), endUtc: visit.endUtc.toISOString(), whenLocal: facts.whenLocal, minutes: facts.minutes,
    state: visit.state, cancelRequested: visit.cancelRequestedAt !== null, cancelPolicy: facts.settings.patientCancel,
    canConfirm: visit.state === 'booked', canCancel: upcoming && visit.cancelRequestedAt === null,
    icsUrl: `/api/visits/${visit.id}/ics?token=${encodeURIComponent(token)}`,
  }
}

export async function publicVisit(token: string): Promise<PublicVisitDto> {
  return toPublicVisit(await visitOfToken(useDb(), token), token)
}

export async function confirmByPatient(token: string): Promise<PublicVisitDto> {
  await inTransaction(async (trx) => confirmForPatient(trx, await visitOfToken(trx, token), 'patient link'))
  return publicVisit(token)
}

/** The patient confirms (by link or text reply, `by` says which): booked → confirmed, audited. */
export async function confirmForPatient(trx: Db, context: MailContext, by: string): Promise<'confirmed' | 'already_confirmed'> {
  if (context.visit.state === 'confirmed') return 'already_confirmed'
  if (context.visit.state !== 'booked') throw conflict(`A ${context.visit.state} visit cannot be confirmed.`, { field: 'state' })
  if (!(await confirmVisit(trx, context.visit.id, context.visit.rowVersion))) throw conflict('The visit changed just now. Reload the page.', { field: 'rowVersion' })
  await writeAudit(trx, { userId: null, action: 'visit_confirmed', entity: 'visit', entityId: context.visit.id, before: { state: 'booked' }, after: { state: 'confirmed', by } })
  return 'confirmed'
}

async function cancelAtOnce(db: Db, context: MailContext, reason: string): Promise<void> {
  const { visit } = context
  const changed = await updateVisitIfVersion(db, visit.id, visit.rowVersion, {
    state: 'cancelled', cancel_reason: reason, ical_sequence: visit.icalSequence + 1, cancel_requested_at: new Date(),
  })
  if (!changed) throw conflict('The visit changed just now. Reload the page.', { field: 'rowVersion' })
  await replaceSegments(db, visit.id, [])
  await dropQueuedReminders(db, visit.id)
  await enqueueMessages(db, await onChannels(db, context.patient.id, context.site.settings, [
    { kind: 'cancellation', visitId: visit.id, siteId: context.site.id, dueAt: new Date(), payload: { visitId: visit.id } },
  ]))
}

export async function requestCancelByPatient(token: string): Promise<PublicVisitDto> {
  await inTransaction(async (trx) => requestCancelForPatient(trx, await visitOfToken(trx, token), { by: 'patient link', reason: PATIENT_CANCEL_REASON }))
  return publicVisit(token)
}

/**
 * The patient asks to cancel (by link or text reply): the site's `patientCancel` policy records a
 * request for the front desk or cancels at once. Audited.
 */
export async function requestCancelForPatient(trx: Db, context: MailContext, how: { by: string; reason: string }): Promise<'cancelled' | 'cancel_requested' | 'already'> {
  const { visit } = context
  if (visit.state === 'cancelled' || visit.cancelRequestedAt) return 'already'
  if (!canMoveToState(visit.state, 'cancelled') || (visit.state !== 'booked' && visit.state !== 'confirmed')) {
    throw conflict(`A ${visit.state} visit cannot be cancelled from the link. Please call the practice.`, { field: 'state' })
  }
  const atOnce = mailSettingsOf(context.site.settings).patientCancel === 'cancel'
  if (atOnce) await cancelAtOnce(trx, context, how.reason)
  else await recordCancelRequest(trx, visit.id)
  await writeAudit(trx, { userId: null, action: atOnce ? 'visit_cancelled' : 'visit_cancel_requested', entity: 'visit', entityId: visit.id, before: { state: visit.state }, after: { by: how.by, reason: how.reason } })
  return atOnce ? 'cancelled' : 'cancel_requested'
}

/** The current event for this visit: REQUEST while it stands, CANCEL once cancelled. */
export async function currentCalendar(visitId: number, token: string): Promise<{ ics: string; method: 'REQUEST' | 'CANCEL' }> {
  const context = await visitOfToken(useDb(), token, visitId)
  const method = methodFor(context)
  return { ics: visitCalendar(context, visitFacts(context), method), method }
}
