// The front desk's side of texts: a visit's thread (texts sent and replies), a free-text message to
// the visit's patient (queued in the outbox, audited), and the unanswered replies of its sites.
import type { SessionUser } from '#shared/types/auth'
import type { SmsReplyDto, TextThreadDto } from '#shared/types/sms'
import { useDb, type Db } from '../../utils/db'
import { inTransaction } from '../../utils/db-retry'
import { conflict, notFound } from '../../utils/errors'
import { requireSiteAccess } from '../../utils/auth'
import { findVisitRow } from '../../repositories/visits'
import { enqueueMessage } from '../../repositories/outbox'
import { writeAudit } from '../../repositories/audit-log'
import { findReply, findTextPatient, listUnansweredReplies, markReplyAnswered, textThreadOf } from '../../repositories/sms'
import { toE164 } from '#shared/domain/sms-phone'
import type { CountryCode } from 'libphonenumber-js'
import { smsConfig } from '../../utils/sms-client'

async function visibleVisit(db: Db, visitId: number, user: SessionUser) {
  const visit = await findVisitRow(db, visitId)
  if (!visit) throw notFound('No such visit.')
  requireSiteAccess(user, visit.site_id)
  return visit
}

async function reachOf(db: Db, patientId: number): Promise<{ number: string | null; blocked: string | null }> {
  const patient = await findTextPatient(db, patientId)
  const number = toE164(patient?.phone, smsConfig().defaultCountry as CountryCode)
  if (!smsConfig().accountSid) return { number, blocked: 'Text messages are not set up.' }
  if (!patient || !number) return { number, blocked: 'The patient has no mobile number that can take texts.' }
  if (!patient.smsConsent) return { number, blocked: 'The patient has not agreed to texts.' }
  if (patient.smsOptedOutAt) return { number, blocked: 'The patient replied STOP: no texts until they reply START.' }
  return { number, blocked: null }
}

export async function textThread(visitId: number, user: SessionUser): Promise<TextThreadDto> {
  const db = useDb()
  const visit = await visibleVisit(db, visitId, user)
  return { visitId, ...(await reachOf(db, visit.patient_id)), entries: await textThreadOf(db, visitId) }
}

export async function sendFreeText(visitId: number, body: string, user: SessionUser): Promise<TextThreadDto> {
  await inTransaction(async (trx) => {
    const visit = await visibleVisit(trx, visitId, user)
    const { blocked } = await reachOf(trx, visit.patient_id)
    if (blocked) throw conflict(blocked, { field: 'body' })
    const id = await enqueueMessage(trx, { kind: 'free_text', channel: 'sms', visitId, siteId: visit.site_id, dueAt: new Date(), payload: { visitId, body, userId: user.id } })
    await writeAudit(trx, { userId: user.id, action: 'text_written', entity: 'visit', entityId: visitId, after: { outboxId: id, body } })
  })
  return textThread(visitId, user)
}

export async function unansweredReplies(siteId: number | undefined, user: SessionUser): Promise<SmsReplyDto[]> {
  if (siteId !== undefined) requireSiteAccess(user, siteId)
  return listUnansweredReplies(useDb(), { siteIds: user.allSites ? 'all' : user.siteIds, siteId })
}

export async function markAnswered(id: number, user: SessionUser): Promise<SmsReplyDto> {
  return inTransaction(async (trx) => {
    const reply = await findReply(trx, id)
    if (!reply || reply.siteId === null) throw notFound('No such reply.')
    requireSiteAccess(user, reply.siteId)
    await markReplyAnswered(trx, id, user.id)
    await writeAudit(trx, { userId: user.id, action: 'text_reply_answered', entity: 'visit', entityId: reply.visitId, after: { replyId: id } })
    return (await findReply(trx, id))!
  })
}
