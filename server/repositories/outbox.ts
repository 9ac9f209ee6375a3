// Patient e-mails waiting to be sent. Rows are written inside the booking transaction and claimed by
// dispatchers with SELECT … FOR UPDATE SKIP LOCKED, so several processes never take the same row.
import { recipientOf } from '#shared/domain/message-recipient'
import { localDateAt } from '#shared/utils/local-date'
import { hostname } from 'node:os'
import { escapeLike } from './patients'
import type { Db } from '../utils/db'
import type { OutboxKind, OutboxMessageDto, OutboxState, RenderedMessage } from '#shared/types/outbox'
import { parseJson } from './json'
import type { Channel } from '#shared/domain/sms-channels'
import { allOf, writeOnly, type Statement } from './round-trip'

export type { OutboxKind } from '#shared/types/outbox'

export interface OutboxRow {
  id: number
  kind: OutboxKind
  channel: Channel
  provider_status: string | null
  visit_id: number | null
  site_id: number | null
  payload: string
  due_at: Date
  state: OutboxState
  attempts: number
  last_error: string | null
  lease_until: Date | null
  message_id: string | null
  sent_at: Date | null
  rendered: string | null
}

export interface OutboxPayload {
  visitId?: number
  /** Reminders: the visit start they were planned for; a moved visit makes them stale. */
  startUtc?: string
  offsetHours?: number
  resendOf?: number
  /** Offers (issue 17): the offer the e-mail is about. */
  offerId?: number
  /** Recalls (issue 17): the recall the e-mail is about. */
  recallId?: number
  /** Move offers (issue 17 §3): the offer the e-mail is about. */
  moveOfferId?: number
  /** Updates: what the patient sees that changed (issue 15), and the length they were told before. */
  change?: { time: boolean; length: boolean; what: boolean; minutesBefore?: number }
  /** An e-mail sent because the text of this outbox row failed. */
  fallbackOf?: number
  /** Texts of the front desk and answers to replies: the words, who wrote them, the reply answered. */
  body?: string
  userId?: number
  replyId?: number
  /** Answers to replies: the number that wrote (E.164). */
  to?: string
  /** An answer to STOP goes out although the patient has just opted out. */
  optOutNotice?: boolean
  /** An answer to a reply to an offer text: that text's outbox row (one answer per offer text). */
  aboutText?: number
}

export interface NewOutboxMessage {
  kind: OutboxKind
  /** 'email' when left out. */
  channel?: Channel
  /** Null for texts that answer a reply matching no visit, and for a waitlist offer (payload.offerId), which has no visit yet. */
  visitId: number | null
  siteId: number
  dueAt: Date
  payload: OutboxPayload
}

/** Several messages in one insert (a visit's invitation and its reminders). */
function outboxRow(message: NewOutboxMessage) {
  return {
    kind: message.kind, channel: message.channel ?? 'email', visit_id: message.visitId, site_id: message.siteId,
    due_at: message.dueAt, payload: JSON.stringify(message.payload),
  }
}

export async function enqueueMessages(db: Db, messages: NewOutboxMessage[]): Promise<void> {
  if (!messages.length) return
  await db('outbox').insert(messages.map(outboxRow))
}

/** The same write as statements (none for no messages), to go with others in one round trip. */
export function enqueueStatement(db: Db, messages: NewOutboxMessage[]): Statement<unknown> {
  return allOf(messages.length ? [writeOnly(db('outbox').insert(messages.map(outboxRow)))] : [])
}

export async function enqueueMessage(db: Db, message: NewOutboxMessage): Promise<number> {
  const [id] = await db('outbox').insert(outboxRow(message))
  return id as number
}

/** Reminders not yet sent are dropped when a visit moves or is cancelled (they are planned again). */
export async function skipQueuedReminders(db: Db, visitId: number, reason: string): Promise<number> {
  return db('outbox').where({ visit_id: visitId, kind: 'reminder', state: 'queued' })
    .update({ state: 'skipped', last_error: reason })
}

export function payloadOf(row: OutboxRow): OutboxPayload {
  return parseJson<OutboxPayload>(row.payload, {})
}

export interface ClaimOptions {
  limit: number
  leaseSeconds: number
  /** Sites in this dispatcher's mail lane ('' = every site without a lane of its own). */
  lane: string
}

/** Site ids whose settings name a mail lane (a small table; read without locks). */
async function sitesWithLanes(db: Db): Promise<Array<{ id: number; lane: string }>> {
  const rows = await db('sites').select('id', db.raw("COALESCE(JSON_UNQUOTE(JSON_EXTRACT(settings, '$.mailLane')), '') as lane"))
  return (rows as Array<{ id: number; lane: string }>).filter((row) => row.lane !== '' && row.lane !== 'null')
}

/**
 * Claims up to `limit` due rows (queued and due, or sending with an expired lease). Call inside one
 * short transaction: the rows are locked with FOR UPDATE SKIP LOCKED and marked 'sending' with a
 * fresh lease. The lease value is the claim: later updates only apply while it is still ours.
 */
export async function claimDueMessages(trx: Db, options: ClaimOptions): Promise<OutboxRow[]> {
  const laneSites = await sitesWithLanes(trx)
  const now = new Date()
  const query = trx<OutboxRow>('outbox')
    .where((due) => due.where((queued) => queued.where('state', 'queued').where('due_at', '<=', now))
      .orWhere((stale) => stale.where('state', 'sending').where('lease_until', '<', now)))
    .orderBy('due_at').orderBy('id').limit(options.limit).forUpdate().skipLocked()
  if (options.lane) {
    query.whereIn('site_id', laneSites.filter((site) => site.lane === options.lane).map((site) => site.id))
  } else if (laneSites.length) {
    query.where((own) => own.whereNull('site_id').orWhereNotIn('site_id', laneSites.map((site) => site.id)))
  }
  const rows = await query.select('*')
  if (!rows.length) return []
  const leaseUntil = new Date(now.getTime() + options.leaseSeconds * 1000)
  await trx('outbox').whereIn('id', rows.map((row) => row.id)).update({ state: 'sending', lease_until: leaseUntil, attempts: trx.raw('attempts + 1') })
  return rows.map((row) => ({ ...row, state: 'sending' as const, lease_until: leaseUntil, attempts: row.attempts + 1 }))
}

function ours(db: Db, row: OutboxRow) {
  return db('outbox').where({ id: row.id, state: 'sending', lease_until: row.lease_until })
}

/** Keeps the row's Message-ID before the first try (false when the lease is no longer ours). */
export async function fixMessageId(db: Db, row: OutboxRow, messageId: string): Promise<boolean> {
  return (await ours(db, row).whereNull('message_id').update({ message_id: messageId })) === 1
}

export async function markSent(db: Db, row: OutboxRow, messageId: string, rendered: RenderedMessage): Promise<boolean> {
  const changed = await ours(db, row).update({
    state: 'sent', message_id: messageId.slice(0, 300), sent_at: new Date(), sent_by: `${hostname()}:${process.pid}`.slice(0, 100),
    lease_until: null, last_error: null, rendered: JSON.stringify(rendered),
  })
  return changed === 1
}

export async function markSkipped(db: Db, row: OutboxRow, reason: string): Promise<void> {
  await ours(db, row).update({ state: 'skipped', lease_until: null, last_error: reason.slice(0, 1000) })
}

export async function markRetry(db: Db, row: OutboxRow, error: string, retryAt: Date): Promise<void> {
  await ours(db, row).update({ state: 'queued', lease_until: null, due_at: retryAt, last_error: error.slice(0, 1000) })
}

export async function markFailed(db: Db, row: OutboxRow, error: string): Promise<void> {
  await ours(db, row).update({ state: 'failed', lease_until: null, last_error: error.slice(0, 1000) })
}

interface ListedRow extends OutboxRow {
  first_name: string | null
  last_name: string | null
  email: string | null
  phone: string | null
  start_utc: Date | null
  date_of_birth: string | null
  guardian_name: string | null
  guardian_email: string | null
  guardian_phone: string | null
  visit_time_zone: string | null
  /** The visit's start, or a waitlist offer's offered time: the date the recipient rule reads. */
  recipient_on_utc: Date | null
}

export interface OutboxFilter {
  siteIds: number[] | 'all'
  siteId?: number
  visitId?: number
  state?: OutboxState
  patient?: string
  beforeId?: number
  channel?: Channel
  limit: number
}

// A waitlist offer's rows have no visit: their patient is the offer's waitlist entry's, and the date
// whose recipient rule applies is the offered time's, at the offer's site (as `noticeMail` and `noticeText` send).
function listQuery(db: Db) {
  return db('outbox')
    .leftJoin('visits', 'visits.id', 'outbox.visit_id')
    .leftJoin('offers', (on) => on.on('offers.id', '=', db.raw("JSON_VALUE(outbox.payload, '$.offerId')")).andOnVal('outbox.kind', '=', 'offer'))
    .leftJoin('waitlist_entries as offer_entries', 'offer_entries.id', 'offers.entry_id')
    .leftJoin('patients', 'patients.id', db.raw('COALESCE(visits.patient_id, offer_entries.patient_id)'))
    .leftJoin('sites as visit_sites', 'visit_sites.id', db.raw('COALESCE(visits.site_id, offers.site_id)'))
    .select('outbox.*', 'patients.first_name', 'patients.last_name', 'patients.email', 'patients.phone', 'visits.start_utc',
      'patients.date_of_birth', 'patients.guardian_name', 'patients.guardian_email', 'patients.guardian_phone', 'visit_sites.time_zone as visit_time_zone',
      db.raw('COALESCE(visits.start_utc, offers.start_utc) as recipient_on_utc'))
}

/** Who the row is addressed to: the patient, or a minor's guardian (shared/domain/message-recipient.ts); null when nobody. */
function recipientText(row: ListedRow): string | null {
  const channel = row.channel === 'sms' ? 'sms' : 'email'
  if (row.first_name === null || !row.recipient_on_utc || !row.visit_time_zone) return channel === 'sms' ? row.phone : row.email
  const chosen = recipientOf({
    firstName: row.first_name, lastName: row.last_name ?? '', dateOfBirth: row.date_of_birth, email: row.email, phone: row.phone,
    guardianName: row.guardian_name, guardianEmail: row.guardian_email, guardianPhone: row.guardian_phone,
  }, channel, localDateAt(row.recipient_on_utc.getTime(), row.visit_time_zone))
  if ('skip' in chosen) return null
  return chosen.onBehalfOf ? `${chosen.to} (guardian: ${chosen.name})` : chosen.to
}

export function toOutboxDto(row: ListedRow): OutboxMessageDto {
  return {
    id: row.id, kind: row.kind, channel: row.channel, providerStatus: row.provider_status, state: row.state, visitId: row.visit_id, siteId: row.site_id,
    patientName: row.first_name === null ? null : `${row.first_name} ${row.last_name}`, recipient: recipientText(row),
    visitStartUtc: row.start_utc ? row.start_utc.toISOString() : null, dueAt: row.due_at.toISOString(),
    sentAt: row.sent_at ? row.sent_at.toISOString() : null, attempts: row.attempts, lastError: row.last_error, messageId: row.message_id,
  }
}

export async function listOutbox(db: Db, filter: OutboxFilter): Promise<OutboxMessageDto[]> {
  const query = listQuery(db).orderBy('outbox.id', 'desc').limit(filter.limit)
  if (filter.siteIds !== 'all') query.whereIn('outbox.site_id', filter.siteIds)
  if (filter.siteId !== undefined) query.where('outbox.site_id', filter.siteId)
  if (filter.visitId !== undefined) query.where('outbox.visit_id', filter.visitId)
  if (filter.state !== undefined) query.where('outbox.state', filter.state)
  if (filter.beforeId !== undefined) query.where('outbox.id', '<', filter.beforeId)
  if (filter.patient !== undefined) {
    const text = filter.patient
    if (text.includes('@')) query.where('patients.email', 'like', `%${escapeLike(text)}%`)
    else {
      for (const word of text.split(/\s+/).filter(Boolean)) {
        query.where((name) => name.where('patients.first_name', 'like', `${escapeLike(word)}%`).orWhere('patients.last_name', 'like', `${escapeLike(word)}%`))
      }
    }
  }
  if (filter.channel !== undefined) query.where('outbox.channel', filter.channel)
  return ((await query) as ListedRow[]).map(toOutboxDto)
}

export async function findOutboxListed(db: Db, id: number): Promise<{ dto: OutboxMessageDto; row: OutboxRow } | undefined> {
  const row = (await listQuery(db).where('outbox.id', id).first()) as ListedRow | undefined
  return row ? { dto: toOutboxDto(row), row } : undefined
}

export function renderedOf(row: OutboxRow): RenderedMessage | null {
  return row.rendered ? parseJson<RenderedMessage | null>(row.rendered, null) : null
}
