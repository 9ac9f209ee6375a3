// Text messages: a patient's text reach (number, consent, opt-out), outbox rows of channel 'sms'
// as the service reports on them, and patients' replies (sms_replies).
import type { Db } from '../utils/db'
import type { OutboxRow } from './outbox'
import type { RenderedMessage } from '#shared/types/outbox'
import type { SmsReplyDto, TextThreadEntry } from '#shared/types/sms'
import { parseJson } from './json'

export interface TextPatient {
  id: number
  firstName: string
  lastName: string
  phone: string | null
  email: string | null
  emailConsent: boolean
  smsConsent: boolean
  smsOptedOutAt: Date | null
  /** A minor's messages go to the guardian (shared/domain/message-recipient.ts). */
  dateOfBirth: string | null
  guardianName: string | null
  guardianEmail: string | null
  guardianPhone: string | null
}

export interface TextPatientRow {
  id: number
  first_name: string
  last_name: string
  phone: string | null
  email: string | null
  email_consent: number
  sms_consent: number
  sms_opted_out_at: Date | null
  date_of_birth: string | null
  guardian_name: string | null
  guardian_email: string | null
  guardian_phone: string | null
}

const PATIENT_COLUMNS = ['id', 'first_name', 'last_name', 'phone', 'email', 'email_consent', 'sms_consent', 'sms_opted_out_at', 'date_of_birth', 'guardian_name', 'guardian_email', 'guardian_phone'] as const

export function toTextPatient(row: TextPatientRow): TextPatient {
  return {
    id: row.id, firstName: row.first_name, lastName: row.last_name, phone: row.phone, email: row.email, emailConsent: Boolean(row.email_consent),
    smsConsent: Boolean(row.sms_consent), smsOptedOutAt: row.sms_opted_out_at,
    dateOfBirth: row.date_of_birth, guardianName: row.guardian_name, guardianEmail: row.guardian_email, guardianPhone: row.guardian_phone,
  }
}

export async function findTextPatient(db: Db, id: number): Promise<TextPatient | undefined> {
  const row = await db<TextPatientRow>('patients').where({ id }).first(...PATIENT_COLUMNS)
  return row ? toTextPatient(row) : undefined
}

/**
 * Patients whose stored number ends with these digits (its national number); the caller keeps those
 * whose number reads as the same E.164 number. Stored numbers are free text ("(209) 555-0148"), so
 * this reads every patient with a number (see README: a stored E.164 column would index it).
 */
export async function patientsWithNumberEnding(db: Db, digits: string): Promise<TextPatient[]> {
  const pattern = `%${digits.replace(/\D/g, '')}`
  // A guardian answers for a minor from their own number: theirs counts as the patient's here.
  const rows = await db<TextPatientRow>('patients').where((where) => where
    .whereRaw("REGEXP_REPLACE(phone, '[^0-9]', '') LIKE ?", [pattern])
    .orWhereRaw("REGEXP_REPLACE(guardian_phone, '[^0-9]', '') LIKE ?", [pattern]))
    .orderBy('id').limit(50).select(...PATIENT_COLUMNS)
  return rows.map(toTextPatient)
}

export async function setTextOptOut(db: Db, patientIds: number[], at: Date | null): Promise<void> {
  if (!patientIds.length) return
  await db('patients').whereIn('id', patientIds).update({ sms_opted_out_at: at, updated_at: db.fn.now(3) })
}

export interface AwaitingVisit {
  id: number
  patientId: number
  siteId: number
  state: string
  startUtc: Date
}

/**
 * The next visit of these patients that a reply can answer: for 'confirm' a booked one, otherwise a
 * booked or confirmed one, not yet asked to be cancelled, starting after now. Soonest first.
 */
export async function nextAnsweringVisit(db: Db, patientIds: number[], purpose: 'confirm' | 'cancel' | 'any', now: Date): Promise<AwaitingVisit | undefined> {
  if (!patientIds.length) return undefined
  const query = db('visits').whereIn('patient_id', patientIds).where('start_utc', '>', now)
    .whereIn('state', purpose === 'confirm' ? ['booked'] : ['booked', 'confirmed'])
    .orderBy('start_utc').orderBy('id').first('id', 'patient_id', 'site_id', 'state', 'start_utc')
  if (purpose !== 'any') query.whereNull('cancel_requested_at')
  const row = await query
  return row ? { id: row.id, patientId: row.patient_id, siteId: row.site_id, state: row.state, startUtc: row.start_utc } : undefined
}

/** The site that last texted any of these patients (for a reply that matches no visit). */
export async function lastTextingSite(db: Db, patientIds: number[]): Promise<number | null> {
  if (!patientIds.length) return null
  const row = await db('outbox').join('visits', 'visits.id', 'outbox.visit_id').whereIn('visits.patient_id', patientIds)
    .where('outbox.channel', 'sms').whereNotNull('outbox.site_id').orderBy('outbox.id', 'desc').first('outbox.site_id')
  return row ? row.site_id : null
}

/** The latest text sent to a number: its outbox row's kind, site and visit (none for a waitlist offer). */
export interface LastText { outboxId: number; kind: string; siteId: number | null; visitId: number | null }

/**
 * The latest text that went to this number (E.164, as `rendered.to` keeps it), our answers to replies
 * aside: what a reply from the number most likely answers. Reads the sent texts (see README: a stored
 * recipient column would index it).
 */
export async function lastTextTo(db: Db, number: string): Promise<LastText | undefined> {
  // sms_to: the number of a text, a virtual column indexed with the id (migration 20261220100200).
  const row = await db('outbox').where({ sms_to: number, channel: 'sms' }).whereNot('kind', 'reply_confirmation').whereNotNull('sent_at')
    .orderBy('id', 'desc').first('id', 'kind', 'site_id', 'visit_id')
  return row ? { outboxId: row.id, kind: row.kind, siteId: row.site_id, visitId: row.visit_id } : undefined
}

/** Whether a reply to this text (outbox id) was already answered by a text (payload `aboutText`). */
export async function hasAnswerAbout(db: Db, outboxId: number): Promise<boolean> {
  const row = await db('outbox').where({ kind: 'reply_confirmation', channel: 'sms' })
    .whereRaw("JSON_VALUE(payload, '$.aboutText') = ?", [outboxId]).first('id')
  return Boolean(row)
}

export interface TextSite {
  id: number
  name: string
  phone: string
  timeZone: string
  settings: Record<string, unknown>
}

export async function findTextSite(db: Db, id: number): Promise<TextSite | undefined> {
  const row = await db('sites').where({ id }).first('id', 'name', 'phone', 'time_zone', 'settings')
  return row ? { id: row.id, name: row.name, phone: row.phone ?? '', timeZone: row.time_zone, settings: parseJson<Record<string, unknown>>(row.settings, {}) } : undefined
}

// Outbox rows of channel 'sms'. Updates while sending apply only while the claim's lease is ours.
function ours(db: Db, row: OutboxRow) {
  return db('outbox').where({ id: row.id, state: 'sending', lease_until: row.lease_until })
}

export async function markTextSent(db: Db, row: OutboxRow, sid: string, status: string, rendered: RenderedMessage): Promise<boolean> {
  const changed = await ours(db, row).update({
    state: 'sent', message_id: sid.slice(0, 300), provider_status: status.slice(0, 20), sent_at: new Date(), lease_until: null, last_error: null, rendered: JSON.stringify(rendered),
  })
  return changed === 1
}

/** Back to the queue until `until` without counting the claim as an attempt (quiet hours). */
export async function deferText(db: Db, row: OutboxRow, until: Date, reason: string): Promise<void> {
  await ours(db, row).update({ state: 'queued', lease_until: null, due_at: until, attempts: db.raw('GREATEST(attempts - 1, 0)'), last_error: reason.slice(0, 1000) })
}

export async function findTextBySid(db: Db, sid: string): Promise<OutboxRow | undefined> {
  return db<OutboxRow>('outbox').where({ message_id: sid, channel: 'sms' }).first()
}

/** The service's report on a sent text; a failure turns the row 'failed' with the service's code. */
export async function recordTextStatus(db: Db, id: number, status: string, failure: string | null): Promise<void> {
  await db('outbox').where({ id }).update({
    provider_status: status.slice(0, 20), ...(failure ? { state: 'failed', last_error: failure.slice(0, 1000) } : {}),
  })
}

/** Whether this visit already has an e-mail invitation or update queued, on its way or sent. */
export async function hasMailInvitation(db: Db, visitId: number): Promise<boolean> {
  const row = await db('outbox').where({ visit_id: visitId, channel: 'email' }).whereIn('kind', ['invitation', 'update'])
    .whereIn('state', ['queued', 'sending', 'sent']).first('id')
  return Boolean(row)
}

// Replies from patients.
export interface NewReply {
  messageSid: string
  fromNumber: string
  body: string
  patientId: number | null
  visitId: number | null
  siteId: number | null
  outcome: string
}

/** Stores a reply; false when the service delivered this one before (same message SID). */
export async function insertReply(db: Db, reply: NewReply): Promise<number | null> {
  const existing = await db('sms_replies').where({ message_sid: reply.messageSid }).first('id')
  if (existing) return null
  const [id] = await db('sms_replies').insert({
    message_sid: reply.messageSid, from_number: reply.fromNumber, body: reply.body, patient_id: reply.patientId,
    visit_id: reply.visitId, site_id: reply.siteId, outcome: reply.outcome,
  })
  return id as number
}

export async function updateReply(db: Db, id: number, what: { outcome: string; visitId: number | null; siteId: number | null; patientId: number | null }): Promise<void> {
  await db('sms_replies').where({ id }).update({ outcome: what.outcome, visit_id: what.visitId, site_id: what.siteId, patient_id: what.patientId })
}

interface ReplyRow {
  id: number
  from_number: string
  body: string
  patient_id: number | null
  visit_id: number | null
  site_id: number | null
  outcome: string
  received_at: Date
  answered_at: Date | null
  first_name: string | null
  last_name: string | null
  start_utc: Date | null
}

function toReplyDto(row: ReplyRow): SmsReplyDto {
  return {
    id: row.id, fromNumber: row.from_number, body: row.body, patientId: row.patient_id, visitId: row.visit_id, siteId: row.site_id,
    outcome: row.outcome, receivedAt: row.received_at.toISOString(), answeredAt: row.answered_at ? row.answered_at.toISOString() : null,
    patientName: row.first_name === null ? null : `${row.first_name} ${row.last_name}`, visitStartUtc: row.start_utc ? row.start_utc.toISOString() : null,
  }
}

function replyQuery(db: Db) {
  return db('sms_replies').leftJoin('patients', 'patients.id', 'sms_replies.patient_id').leftJoin('visits', 'visits.id', 'sms_replies.visit_id')
    .select('sms_replies.*', 'patients.first_name', 'patients.last_name', 'visits.start_utc')
}

/** Replies no keyword answered (replies to an offer text among them) and the front desk has not marked answered, newest first. */
export async function listUnansweredReplies(db: Db, filter: { siteIds: number[] | 'all'; siteId?: number }): Promise<SmsReplyDto[]> {
  const query = replyQuery(db).whereIn('sms_replies.outcome', ['unanswered', 'no_visit', 'offer_reply']).whereNull('sms_replies.answered_at')
    .whereNotNull('sms_replies.site_id').orderBy('sms_replies.id', 'desc').limit(200)
  if (filter.siteIds !== 'all') query.whereIn('sms_replies.site_id', filter.siteIds)
  if (filter.siteId !== undefined) query.where('sms_replies.site_id', filter.siteId)
  return ((await query) as ReplyRow[]).map(toReplyDto)
}

export async function findReply(db: Db, id: number): Promise<SmsReplyDto | undefined> {
  const row = (await replyQuery(db).where('sms_replies.id', id).first()) as ReplyRow | undefined
  return row ? toReplyDto(row) : undefined
}

export async function markReplyAnswered(db: Db, id: number, userId: number): Promise<void> {
  await db('sms_replies').where({ id }).whereNull('answered_at').update({ answered_at: new Date(), answered_by: userId })
}

/** A visit's texts both ways, oldest first: texts sent or waiting (outbox) and the patient's replies. */
export async function textThreadOf(db: Db, visitId: number): Promise<TextThreadEntry[]> {
  const sent = await db('outbox').where({ visit_id: visitId, channel: 'sms' }).orderBy('id')
    .select('id', 'kind', 'state', 'provider_status', 'rendered', 'payload', 'due_at', 'sent_at', 'created_at', 'last_error')
  const replies = await db('sms_replies').where({ visit_id: visitId }).orderBy('id').select('id', 'body', 'outcome', 'received_at', 'answered_at')
  const entries: TextThreadEntry[] = [
    ...sent.map((row): TextThreadEntry => {
      const rendered = row.rendered ? parseJson<RenderedMessage | null>(row.rendered, null) : null
      const payload = parseJson<{ body?: string }>(row.payload, {})
      return {
        direction: 'out', id: row.id, kind: row.kind, text: rendered?.text ?? payload.body ?? null, state: row.state, status: row.provider_status,
        // Waiting texts sit at the time they are due (a reminder days ahead comes after today's texts).
        at: (row.sent_at ?? (row.state === 'queued' || row.state === 'sending' ? row.due_at : row.created_at)).toISOString(), note: row.state === 'sent' ? null : row.last_error,
      }
    }),
    ...replies.map((row): TextThreadEntry => ({
      direction: 'in', id: row.id, kind: 'reply', text: row.body, state: row.outcome, status: row.answered_at ? 'answered' : null, at: row.received_at.toISOString(), note: null,
    })),
  ]
  return entries.sort((a, b) => a.at.localeCompare(b.at) || (a.direction === b.direction ? a.id - b.id : a.direction === 'out' ? -1 : 1))
}
