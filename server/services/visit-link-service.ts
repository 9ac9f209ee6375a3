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
import { confirmVisit, loadMailContext, recordCancelRequest, turnRemindersOff, type MailContext } from '../repositories/mail-context'
import { replaceSegments, updateVisitIfVersion } from '../repositories/visits'
import { writeAudit } from '../repositories/audit-log'
import { enqueueMessages } from '../repositories/outbox'
import { onChannels } from './sms/channels'
import { visitFacts } from './mail/visit-facts'
import { methodFor, patientSpan, visitCalendar } from './mail/calendar'
import { organizerOf } from './mail/dispatcher'
import { mailSettingsOf } from '#shared/domain/site-settings'
import { dropQueuedReminders } from './mail/reminders'

const LINK_NOT_FOUND = 'This link is not valid. Please call the practice.'
const PATIENT_CANCEL_REASON = 'The patient asked to cancel'

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
    // The patient's span (seating to dismissal), as in the e-mail and the calendar event.
    startUtc: visit.startUtc.toISOString(), endUtc: new Date(patientSpan(context, facts).endMs).toISOString(), whenLocal: facts.whenLocal, minutes: facts.minutes,
    state: visit.state, cancelRequested: visit.cancelRequestedAt !== null, cancelPolicy: facts.settings.patientCancel,
    canConfirm: visit.state === 'booked', canCancel: upcoming && visit.cancelRequestedAt === null,
    icsUrl: `/api/visits/${visit.id}/ics?token=${encodeURIComponent(token)}`,
    remindersOff: context.patient.remindersOffAt !== null,
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
    // The patient's own cancellation is not undone by staff: no previous state kept.
    previous_state: null, state_changed_at: null,
  })
  if (!changed) throw conflict('The visit changed just now. Reload the page.', { field: 'rowVersion' })
  await replaceSegments(db, visit.id, [])
  await dropQueuedReminders(db, visit.id)
  await enqueueMessages(db, await onChannels(db, context.patient.id, context.site.settings, [
    { kind: 'cancellation', visitId: visit.id, siteId: context.site.id, dueAt: new Date(), payload: { visitId: visit.id } },
  ]))
}

/**
 * The patient asks to cancel, through the link, by declining in their calendar (inbound-service) or
 * by a text reply (sms/webhook-service): a request for the front desk, or a cancellation at once where
 * the site's `patientCancel` says so. 'already' when there was nothing to do (cancelled or asked).
 */
export async function patientAsksToCancel(trx: Db, context: MailContext, by: string, note?: string): Promise<'cancelled' | 'cancel_requested' | 'already'> {
  const { visit } = context
  if (visit.state === 'cancelled' || visit.cancelRequestedAt) return 'already'
  if (!canMoveToState(visit.state, 'cancelled') || (visit.state !== 'booked' && visit.state !== 'confirmed')) {
    throw conflict(`A ${visit.state} visit cannot be cancelled from the link. Please call the practice.`, { field: 'state' })
  }
  const reason = note ? `${PATIENT_CANCEL_REASON} (${by}): ${note}` : `${PATIENT_CANCEL_REASON} (${by})`
  const atOnce = mailSettingsOf(context.site.settings).patientCancel === 'cancel'
  if (atOnce) await cancelAtOnce(trx, context, reason.slice(0, 500))
  else await recordCancelRequest(trx, visit.id)
  await writeAudit(trx, { userId: null, action: atOnce ? 'visit_cancelled' : 'visit_cancel_requested', entity: 'visit', entityId: visit.id, before: { state: visit.state }, after: { by, reason: PATIENT_CANCEL_REASON, ...(note ? { note } : {}) } })
  return atOnce ? 'cancelled' : 'cancel_requested'
}

export async function requestCancelByPatient(token: string, note?: string): Promise<PublicVisitDto> {
  await inTransaction(async (trx) => {
    await patientAsksToCancel(trx, await visitOfToken(trx, token), 'patient link', note)
  })
  return publicVisit(token)
}

/** The patient stops e-mail reminders (the link or List-Unsubscribe one-click, RFC 8058); other messages keep coming. */
export async function remindersOffByPatient(token: string, by: 'patient link' | 'one-click unsubscribe'): Promise<PublicVisitDto> {
  await inTransaction(async (trx) => {
    const context = await visitOfToken(trx, token)
    if (!(await turnRemindersOff(trx, context.patient.id))) return
    await writeAudit(trx, { userId: null, action: 'patient_reminders_off', entity: 'patient', entityId: context.patient.id, before: { reminders: 'on' }, after: { reminders: 'off', by, visitId: context.visit.id } })
  })
  return publicVisit(token)
}

/** The current event for this visit: REQUEST while it stands, CANCEL once cancelled. */
export async function currentCalendar(visitId: number, token: string): Promise<{ ics: string; method: 'REQUEST' | 'CANCEL' }> {
  const context = await visitOfToken(useDb(), token, visitId)
  const method = methodFor(context)
  const organizer = organizerOf(context, String(useRuntimeConfig().mail.replyAddress ?? ''))
  return { ics: visitCalendar(context, visitFacts(context), method, { organizerEmail: organizer }), method }
}
