// What the dispatcher needs to send a waitlist offer, a move offer or a recall e-mail (issue 17), and
// an offer's text (`noticeText`), read when the row is sent, or why it is not sent any more (the offer
// was answered or expired, consent withdrawn).
import type { Db } from '../../utils/db'
import type { OutboxRow } from '../../repositories/outbox'
import { payloadOf } from '../../repositories/outbox'
import { findEntry, findOffer, type OfferRow } from '../../repositories/waitlist'
import { findRecall } from '../../repositories/recalls'
import { findPatientRow, toPatientRecordDto } from '../../repositories/patients'
import { findSiteDetail } from '../../repositories/sites'
import { signOfferToken } from '../../utils/offer-token'
import { signRecallToken } from '../../utils/recall-token'
import { RECALL_LINK_DAYS } from '#shared/domain/recall'
import { recipientOf } from '#shared/domain/message-recipient'
import { localDateAt } from '#shared/utils/local-date'
import { displayStyleOf, formatDateTime } from '#shared/utils/display-time'
import { reachOn } from '#shared/domain/sms-channels'
import { toE164 } from '#shared/domain/sms-phone'
import { moveOfferText, offerText } from '#shared/domain/sms-text'
import type { CountryCode } from 'libphonenumber-js'
import { findTextPatient } from '../../repositories/sms'
import { smsConfig } from '../../utils/sms-client'
import type { PatientRecordDto } from '#shared/types/patients'
import type { SiteDetail } from '#shared/types/sites'
import { findMoveOffer, type MoveOfferRow } from '../../repositories/move-offers'
import { loadMailContext, type MailContext } from '../../repositories/mail-context'
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

type LinkSettings = Pick<NoticeSettings, 'publicUrl' | 'linkSecret'>

function pageLink(settings: LinkSettings, page: 'offer' | 'move-offer', token: string): string {
  return `${settings.publicUrl.replace(/\/+$/, '')}/${page}/${encodeURIComponent(token)}`
}

/** A waitlist offer still open, with its site, patient, the date whose recipient rule applies and the signed link; or why not. */
interface OpenOffer { offer: OfferRow; site: SiteDetail; patient: PatientRecordDto; onDate: string; link: string }

async function openOffer(db: Db, offerId: number, settings: LinkSettings): Promise<OpenOffer | { skip: string }> {
  const offer = await findOffer(db, offerId)
  if (!offer) return { skip: 'the offer no longer exists' }
  if (offer.state !== 'sent') return { skip: `the offer is ${offer.state}` }
  if (offer.expires_at.getTime() <= Date.now()) return { skip: 'the offer expired before it was sent' }
  const entry = await findEntry(db, offer.entry_id)
  const site = await findSiteDetail(db, offer.site_id)
  const patient = entry ? await patientRecord(db, entry.patientId) : undefined
  if (!entry || !site || !patient) return { skip: 'the waitlist entry no longer exists' }
  const onDate = localDateAt(offer.start_utc.getTime(), site.timeZone)
  return { offer, site, patient, onDate, link: pageLink(settings, 'offer', signOfferToken(settings.linkSecret, offer)) }
}

async function offerMail(db: Db, offerId: number, settings: NoticeSettings): Promise<NoticeMail> {
  const open = await openOffer(db, offerId, settings)
  if ('skip' in open) return { skip: open.skip }
  const { offer, site, patient, link } = open
  const to = addressee(patient, open.onDate)
  if ('skip' in to) return to
  if (!patient.emailConsent) return { skip: 'the patient has not agreed to e-mail' }
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

/** A move offer still open for the visit as it is, with its visit, site and signed link; or why not. */
interface OpenMoveOffer { offer: MoveOfferRow; context: MailContext; site: SiteDetail; link: string }

async function openMoveOffer(db: Db, moveOfferId: number, settings: LinkSettings): Promise<OpenMoveOffer | { skip: string }> {
  const offer = await findMoveOffer(db, moveOfferId)
  if (!offer) return { skip: 'the move offer no longer exists' }
  if (offer.state !== 'sent') return { skip: `the move offer is ${offer.state}` }
  if (offer.expires_at.getTime() <= Date.now()) return { skip: 'the move offer expired before it was sent' }
  const [context, site] = await Promise.all([loadMailContext(db, offer.visit_id), findSiteDetail(db, offer.site_id)])
  if (!context || !site) return { skip: 'the visit no longer exists' }
  if (context.visit.startUtc.getTime() !== offer.from_start_utc.getTime()) return { skip: 'the visit changed since the offer was made' }
  return { offer, context, site, link: pageLink(settings, 'move-offer', signOfferToken(settings.linkSecret, offer, 'move-offer')) }
}

async function moveOfferMail(db: Db, moveOfferId: number, settings: NoticeSettings): Promise<NoticeMail> {
  const open = await openMoveOffer(db, moveOfferId, settings)
  if ('skip' in open) return { skip: open.skip }
  const { offer, context, site, link } = open
  const recipient = messageRecipient(context, 'email')
  if ('skip' in recipient) return { skip: recipient.skip }
  if (!context.patient.emailConsent) return { skip: 'the patient has not agreed to e-mail' }
  const facts = { site, recipient, fromStartMs: offer.from_start_utc.getTime(), startMs: offer.start_utc.getTime(), expiresAtMs: offer.expires_at.getTime(), link }
  return { siteEmail: site.email, compose: (messageId) => composeMoveOfferMail(facts, { from: settings.from, messageId }) }
}

export async function noticeMail(db: Db, row: OutboxRow, settings: NoticeSettings): Promise<NoticeMail> {
  const payload = payloadOf(row)
  if (row.kind === 'offer') return offerMail(db, payload.offerId ?? 0, settings)
  if (row.kind === 'move_offer') return moveOfferMail(db, payload.moveOfferId ?? 0, settings)
  return recallMail(db, payload.recallId ?? 0, row.site_id, settings)
}

/** An offer's text (channel 'sms'): the number (E.164) and the words, or why it is not sent any more. */
export type NoticeText = { skip: string } | { siteId: number; to: string; text: string }

/**
 * The text's recipient on `onDate`: the patient, or a minor's guardian (`reachOn`: consent, STOP, a
 * number that takes texts, checked again at send time), with the guardian's greeting for the words.
 */
async function textRecipient(db: Db, patientId: number, onDate: string): Promise<{ skip: string } | { to: string; guardian?: { greeting: string; patientFirstName: string } }> {
  const patient = await findTextPatient(db, patientId)
  if (!patient) return { skip: 'the patient no longer exists' }
  const country = smsConfig().defaultCountry as CountryCode
  const reach = reachOn(patient, onDate, country).sms
  if (reach !== true) return { skip: reach }
  const chosen = recipientOf(patient, 'sms', onDate)
  const to = 'skip' in chosen ? null : toE164(chosen.to, country)
  if ('skip' in chosen || !to) return { skip: 'the patient has no mobile number that can take texts' }
  return { to, ...(chosen.onBehalfOf ? { guardian: { greeting: chosen.greeting, patientFirstName: patient.firstName } } : {}) }
}

/** Waitlist offers and move offers by text (issue 17 §2, §3): the same facts and signed link as their e-mails. */
export async function noticeText(db: Db, row: OutboxRow, settings: LinkSettings): Promise<NoticeText> {
  const payload = payloadOf(row)
  if (row.kind === 'offer') {
    const open = await openOffer(db, payload.offerId ?? 0, settings)
    if ('skip' in open) return { skip: open.skip }
    const recipient = await textRecipient(db, open.patient.id, open.onDate)
    if ('skip' in recipient) return recipient
    const style = displayStyleOf(open.site)
    return {
      siteId: open.site.id, to: recipient.to,
      text: offerText({
        siteName: open.site.name, when: formatDateTime(open.offer.start_utc, style), until: formatDateTime(open.offer.expires_at, style), link: open.link,
        ...(recipient.guardian ? { guardian: recipient.guardian } : {}),
      }),
    }
  }
  const open = await openMoveOffer(db, payload.moveOfferId ?? 0, settings)
  if ('skip' in open) return { skip: open.skip }
  const { context, offer, site } = open
  const recipient = await textRecipient(db, context.patient.id, localDateAt(context.visit.startUtc.getTime(), site.timeZone))
  if ('skip' in recipient) return recipient
  const style = displayStyleOf(site)
  return {
    siteId: site.id, to: recipient.to,
    text: moveOfferText({
      siteName: site.name, from: formatDateTime(offer.from_start_utc, style), when: formatDateTime(offer.start_utc, style), until: formatDateTime(offer.expires_at, style), link: open.link,
      ...(recipient.guardian ? { guardian: recipient.guardian } : {}),
    }),
  }
}
