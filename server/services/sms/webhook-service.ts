// What the SMS service tells us (its webhooks, already checked for its signature by the handler):
// a text's delivery status, and a patient's reply. A reply is matched by number to the patient's
// next visit waiting for an answer: C/YES/Y confirms it, X/CANCEL/N asks to cancel it (the site's
// patientCancel policy decides whether at once), STOP and the carrier words opt the number out,
// START/UNSTOP back in, anything else is listed for the front desk. A reply from a number whose latest
// text was a waitlist offer or a move offer answers that offer, not a visit: no keyword but STOP/START
// acts on it, it is listed to the site that sent the offer (a move offer's reply also in its visit's
// thread), and the patient is pointed to the offer's link, once per offer text. Each reply is kept,
// audited and answered with a short text (queued in the outbox, so it is logged and shown in the thread).
import type { Db } from '../../utils/db'
import { inTransaction } from '../../utils/db-retry'
import { writeAudit } from '../../repositories/audit-log'
import { enqueueMessage, enqueueMessages, type OutboxRow } from '../../repositories/outbox'
import { loadMailContext } from '../../repositories/mail-context'
import {
  findTextBySid, findTextSite, hasAnswerAbout, hasMailInvitation, insertReply, lastTextingSite, lastTextTo, nextAnsweringVisit,
  patientsWithNumberEnding, recordTextStatus, setTextOptOut, updateReply, type AwaitingVisit, type LastText, type TextPatient,
} from '../../repositories/sms'
import { nationalDigitsOf, toE164 } from '#shared/domain/sms-phone'
import { replyKeywordOf, type ReplyKeyword } from '#shared/domain/sms-replies'
import { replyConfirmationText, type ReplyOutcome } from '#shared/domain/sms-text'
import type { CountryCode } from 'libphonenumber-js'
import { smsConfig } from '../../utils/sms-client'
import { visitFacts } from '../mail/visit-facts'
import { confirmForPatient, patientAsksToCancel } from '../visit-link-service'

const STATUS_ORDER: Record<string, number> = { accepted: 0, scheduled: 0, queued: 1, sending: 2, sent: 3, delivered: 4, read: 5, failed: 6, undelivered: 6, canceled: 6 }
const FAILED = new Set(['failed', 'undelivered'])

export async function recordDeliveryStatus(params: Record<string, string>): Promise<void> {
  const sid = params.MessageSid ?? params.SmsSid ?? ''
  const status = (params.MessageStatus ?? params.SmsStatus ?? '').toLowerCase()
  if (!sid || !(status in STATUS_ORDER)) return
  await inTransaction(async (trx) => {
    const row = await findTextBySid(trx, sid)
    if (!row) return
    // Callbacks may arrive out of order: a later state is never overwritten by an earlier one.
    if ((STATUS_ORDER[row.provider_status ?? ''] ?? -1) >= STATUS_ORDER[status]!) return
    const failure = FAILED.has(status) ? `the SMS service reported the text ${status}${params.ErrorCode ? ` (error ${params.ErrorCode})` : ''}` : null
    await recordTextStatus(trx, row.id, status, failure)
    if (failure) await afterFailedText(trx, row, status, params.ErrorCode ?? null)
  })
}

/** A failed invitation falls back to e-mail when the patient can take e-mail and has none on its way. */
async function afterFailedText(trx: Db, row: OutboxRow, status: string, errorCode: string | null): Promise<void> {
  let fallback: 'email' | null = null
  if (row.kind === 'invitation' && row.visit_id !== null && row.site_id !== null) {
    const context = await loadMailContext(trx, row.visit_id)
    if (context && context.patient.email && context.patient.emailConsent && !(await hasMailInvitation(trx, row.visit_id))) {
      await enqueueMessages(trx, [{ kind: 'invitation', channel: 'email', visitId: row.visit_id, siteId: row.site_id, dueAt: new Date(), payload: { visitId: row.visit_id, fallbackOf: row.id } }])
      fallback = 'email'
    }
  }
  await writeAudit(trx, { userId: null, action: 'text_failed', entity: 'visit', entityId: row.visit_id, after: { outboxId: row.id, kind: row.kind, status, errorCode, fallback } })
}

interface ReplyPlan {
  outcome: ReplyOutcome | 'unknown_number'
  visit: AwaitingVisit | undefined
  siteId: number | null
  /** A reply to an offer text: that text (its outbox row) and, for a move offer, its visit. */
  offerText?: LastText
}

/** Texts a reply cannot answer by keyword: their own link answers them (issue 17 §2, §3). */
const OFFER_KINDS = new Set(['offer', 'move_offer'])

async function actOnReply(trx: Db, keyword: ReplyKeyword | null, patients: TextPatient[], from: string): Promise<ReplyPlan> {
  const ids = patients.map((patient) => patient.id)
  if (!ids.length) return { outcome: 'unknown_number', visit: undefined, siteId: null }
  const now = new Date()
  const latest = await lastTextTo(trx, from)
  const fallbackSite = async (visit?: AwaitingVisit) => visit?.siteId ?? latest?.siteId ?? (await lastTextingSite(trx, ids))
  if (keyword === 'stop' || keyword === 'start') {
    // The number opts out (or back in): every patient record with it.
    await setTextOptOut(trx, ids, keyword === 'stop' ? now : null)
    const visit = await nextAnsweringVisit(trx, ids, 'any', now)
    return { outcome: keyword === 'stop' ? 'opted_out' : 'opted_in', visit, siteId: await fallbackSite(visit) }
  }
  if (latest && OFFER_KINDS.has(latest.kind) && latest.siteId !== null) {
    // "C" after an offer text must not confirm some other visit: the offer's link answers the offer.
    return { outcome: 'offer_reply', visit: undefined, siteId: latest.siteId, offerText: latest }
  }
  if (keyword === 'confirm' || keyword === 'cancel') {
    const visit = await nextAnsweringVisit(trx, ids, keyword, now)
    const context = visit ? await loadMailContext(trx, visit.id) : undefined
    if (visit && context) {
      const outcome = keyword === 'confirm'
        ? await confirmForPatient(trx, context, 'text reply')
        : await patientAsksToCancel(trx, context, 'text reply')
      return { outcome: outcome === 'already' ? 'cancel_requested' : outcome, visit, siteId: visit.siteId }
    }
    const upcoming = await nextAnsweringVisit(trx, ids, 'any', now)
    if (keyword === 'confirm' && upcoming?.state === 'confirmed') return { outcome: 'already_confirmed', visit: upcoming, siteId: upcoming.siteId }
    return { outcome: 'no_visit', visit: undefined, siteId: await fallbackSite(upcoming) }
  }
  const visit = await nextAnsweringVisit(trx, ids, 'any', now)
  return { outcome: 'unanswered', visit, siteId: await fallbackSite(visit) }
}

async function answerText(trx: Db, plan: ReplyPlan, to: string, replyId: number): Promise<void> {
  if (plan.siteId === null) return
  // One pointer to the link per offer text: further replies are listed for the front desk, unanswered by text.
  if (plan.offerText && (await hasAnswerAbout(trx, plan.offerText.outboxId))) return
  const site = await findTextSite(trx, plan.siteId)
  if (!site) return
  const context = plan.visit ? await loadMailContext(trx, plan.visit.id) : undefined
  const when = context ? visitFacts(context).shortWhen : null
  const body = replyConfirmationText(plan.outcome as ReplyOutcome, { siteName: site.name, sitePhone: site.phone, when })
  await enqueueMessage(trx, {
    kind: 'reply_confirmation', channel: 'sms', visitId: plan.visit?.id ?? plan.offerText?.visitId ?? null, siteId: site.id, dueAt: new Date(),
    payload: { body, to, replyId, ...(plan.outcome === 'opted_out' ? { optOutNotice: true } : {}), ...(plan.offerText ? { aboutText: plan.offerText.outboxId } : {}) },
  })
}

export async function receiveReply(params: Record<string, string>): Promise<void> {
  const sid = params.MessageSid ?? params.SmsSid ?? ''
  const from = toE164(params.From ?? '', smsConfig().defaultCountry as CountryCode)
  const body = (params.Body ?? '').slice(0, 1600)
  if (!sid || !from) return
  const digits = nationalDigitsOf(from)
  await inTransaction(async (trx) => {
    const candidates = digits ? await patientsWithNumberEnding(trx, digits) : []
    const country = smsConfig().defaultCountry as CountryCode
    const patients = candidates.filter((patient) => toE164(patient.phone, country) === from || toE164(patient.guardianPhone, country) === from)
    const keyword = replyKeywordOf(body)
    // Kept first: a webhook the service delivers twice is acted on once.
    const replyId = await insertReply(trx, { messageSid: sid, fromNumber: from, body, patientId: patients[0]?.id ?? null, visitId: null, siteId: null, outcome: 'received' })
    if (replyId === null) return
    const plan = await actOnReply(trx, keyword, patients, from)
    const patientId = plan.visit?.patientId ?? patients[0]?.id ?? null
    // A move offer's reply shows in its visit's thread too; a waitlist offer has no visit.
    const visitId = plan.visit?.id ?? plan.offerText?.visitId ?? null
    await updateReply(trx, replyId, { outcome: plan.outcome, visitId, siteId: plan.siteId, patientId })
    await writeAudit(trx, {
      userId: null, action: 'text_reply_received', entity: visitId ? 'visit' : 'patient', entityId: visitId ?? patientId,
      after: { replyId, keyword, outcome: plan.outcome, ...(plan.offerText ? { aboutText: plan.offerText.outboxId, aboutKind: plan.offerText.kind } : {}) },
    })
    if (plan.outcome !== 'unknown_number') await answerText(trx, plan, from, replyId)
  })
}

