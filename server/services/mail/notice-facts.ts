// What the dispatcher needs to send a waitlist offer or a recall e-mail (issue 17), read when the row
// is sent, or why it is not sent any more (the offer was answered or expired, consent withdrawn).
import type { Db } from '../../utils/db'
import type { OutboxRow } from '../../repositories/outbox'
import { payloadOf } from '../../repositories/outbox'
import { findEntry, findOffer } from '../../repositories/waitlist'
import { findRecall } from '../../repositories/recalls'
import { findPatientRow, toPatientRecordDto } from '../../repositories/patients'
import { findSiteDetail } from '../../repositories/sites'
import { signOfferToken } from '../../utils/offer-token'
import { signRecallToken } from '../../utils/recall-token'
import { RECALL_LINK_DAYS } from '#shared/domain/recall'
import { recipientOf } from '#shared/domain/message-recipient'
import { localDateAt } from '#shared/utils/local-date'
import type { PatientRecordDto } from '#shared/types/patients'
import { findMoveOffer } from '../../repositories/move-offers'
import { loadMailContext } from '../../repositories/mail-context'
import { messageRecipient } from './visit-facts'
import { composeMoveOfferMail, composeOfferMail, composeRecallMail, type NoticePatient } from './notice-mail'

type Composed = ReturnType<typeof composeOfferMail>
export type NoticeMail = { skip: string } | { siteEmail: string; compose: (messageId?: string) => Composed }

interface NoticeSettings { from: string; publicUrl: string; linkSecret: string }

export async function patientRecord(db: Db, id: number): Promise<PatientRecordDto | undefined> {
  const row = await findPatientRow(db, id)
  return row ? toPatientRecordDto(row) : undefined
}

/** The patient, or for a minor on `onDate` their guardian (the same rule as visit messages), or why not. */
export function addressee(patient: PatientRecordDto, onDate: string): NoticePatient | { skip: string } {
  const chosen = recipientOf(patient, 'email', onDate)
  if ('skip' in chosen) return chosen
  return { firstName: patient.firstName, lastName: patient.lastName, email: chosen.to, greeting: chosen.greeting, envelopeName: chosen.name, onBehalfOf: chosen.onBehalfOf }
}

async function offerMail(db: Db, offerId: number, settings: NoticeSettings): Promise<NoticeMail> {
  const offer = await findOffer(db, offerId)
  if (!offer) return { skip: 'the offer no longer exists' }
  if (offer.state !== 'sent') return { skip: `the offer is ${offer.state}` }
  if (offer.expires_at.getTime() <= Date.now()) return { skip: 'the offer expired before it was sent' }
  const entry = await findEntry(db, offer.entry_id)
  const site = await findSiteDetail(db, offer.site_id)
  const patient = entry ? await patientRecord(db, entry.patientId) : undefined
  if (!entry || !site || !patient) return { skip: 'the waitlist entry no longer exists' }
  const to = addressee(patient, localDateAt(offer.start_utc.getTime(), site.timeZone))
  if ('skip' in to) return to
  if (!patient.emailConsent) return { skip: 'the patient has not agreed to e-mail' }
  const link = `${settings.publicUrl.replace(/\/+$/, '')}/offer/${encodeURIComponent(signOfferToken(settings.linkSecret, offer))}`
  const facts = { site, patient: to, startMs: offer.start_utc.getTime(), expiresAtMs: offer.expires_at.getTime(), link }
  return { siteEmail: site.email, compose: (messageId) => composeOfferMail(facts, { from: settings.from, messageId }) }
}

async function recallMail(db: Db, recallId: number, siteId: number | null, settings: NoticeSettings): Promise<NoticeMail> {
  const recall = await findRecall(db, recallId)
  const site = siteId === null ? undefined : await findSiteDetail(db, siteId)
  const patient = recall ? await patientRecord(db, recall.patientId) : undefined
  if (!recall || !site || !patient) return { skip: 'the recall no longer exists' }
  const to = addressee(patient, localDateAt(Date.now(), site.timeZone))
  if ('skip' in to) return to
  if (!patient.emailConsent) return { skip: 'the patient has not agreed to e-mail' }
  // The page lists times at the patient's preferred site, or at the site that mailed them.
  const pageSiteId = patient.preferredSiteId ?? site.id
  const token = signRecallToken(settings.linkSecret, { recallId: recall.id, siteId: pageSiteId, patientId: recall.patientId, dueDate: recall.dueDate }, Date.now() + RECALL_LINK_DAYS * 86_400_000)
  const link = `${settings.publicUrl.replace(/\/+$/, '')}/recall-times/${encodeURIComponent(token)}`
  const facts = { site, patient: to, kind: recall.kind, dueDate: recall.dueDate, link }
  return { siteEmail: site.email, compose: (messageId) => composeRecallMail(facts, { from: settings.from, messageId }) }
}

async function moveOfferMail(db: Db, moveOfferId: number, settings: NoticeSettings): Promise<NoticeMail> {
  const offer = await findMoveOffer(db, moveOfferId)
  if (!offer) return { skip: 'the move offer no longer exists' }
  if (offer.state !== 'sent') return { skip: `the move offer is ${offer.state}` }
  if (offer.expires_at.getTime() <= Date.now()) return { skip: 'the move offer expired before it was sent' }
  const [context, site] = await Promise.all([loadMailContext(db, offer.visit_id), findSiteDetail(db, offer.site_id)])
  if (!context || !site) return { skip: 'the visit no longer exists' }
  if (context.visit.startUtc.getTime() !== offer.from_start_utc.getTime()) return { skip: 'the visit changed since the offer was made' }
  const recipient = messageRecipient(context, 'email')
  if ('skip' in recipient) return { skip: recipient.skip }
  if (!context.patient.emailConsent) return { skip: 'the patient has not agreed to e-mail' }
  const link = `${settings.publicUrl.replace(/\/+$/, '')}/move-offer/${encodeURIComponent(signOfferToken(settings.linkSecret, offer, 'move-offer'))}`
  const facts = { site, recipient, fromStartMs: offer.from_start_utc.getTime(), startMs: offer.start_utc.getTime(), expiresAtMs: offer.expires_at.getTime(), link }
  return { siteEmail: site.email, compose: (messageId) => composeMoveOfferMail(facts, { from: settings.from, messageId }) }
}

export async function noticeMail(db: Db, row: OutboxRow, settings: NoticeSettings): Promise<NoticeMail> {
  const payload = payloadOf(row)
  if (row.kind === 'offer') return offerMail(db, payload.offerId ?? 0, settings)
  if (row.kind === 'move_offer') return moveOfferMail(db, payload.moveOfferId ?? 0, settings)
  return recallMail(db, payload.recallId ?? 0, row.site_id, settings)
}
