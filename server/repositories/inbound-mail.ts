// Calendar replies received through the inbound-mail webhook, one row per delivery.
import type { Db } from '../utils/db'
import type { UnmatchedReplyDto } from '#shared/types/outbox'

export type InboundOutcome = 'matched' | 'ignored' | 'unmatched'

export interface NewInboundMail {
  deliveryId: string
  siteId: number | null
  visitId: number | null
  outcome: InboundOutcome
  partstat: string | null
  sender: string | null
  subject: string | null
  note: string
  raw: string
}

export async function deliverySeen(db: Db, deliveryId: string): Promise<boolean> {
  return Boolean(await db('inbound_mail').where({ delivery_id: deliveryId }).first('id'))
}

export async function insertInboundMail(db: Db, mail: NewInboundMail): Promise<number> {
  const [id] = await db('inbound_mail').insert({
    delivery_id: mail.deliveryId, received_at: new Date(), site_id: mail.siteId, visit_id: mail.visitId, outcome: mail.outcome,
    partstat: mail.partstat, sender: mail.sender?.slice(0, 320) ?? null, subject: mail.subject?.slice(0, 500) ?? null,
    note: mail.note.slice(0, 500), raw: mail.raw,
  })
  return id as number
}

/** Replies that matched no visit, newest first: for the Outbox screen. Rows without a site only for group-wide users. */
export async function listUnmatchedReplies(db: Db, filter: { siteIds: number[] | 'all'; siteId?: number }): Promise<UnmatchedReplyDto[]> {
  const query = db('inbound_mail').where({ outcome: 'unmatched' }).orderBy('id', 'desc').limit(50)
    .select('id', 'site_id', 'received_at', 'sender', 'subject', 'note', 'partstat')
  if (filter.siteIds !== 'all') query.whereIn('site_id', filter.siteIds)
  if (filter.siteId !== undefined) query.where('site_id', filter.siteId)
  return (await query).map((row) => ({
    id: row.id, siteId: row.site_id, receivedAt: row.received_at.toISOString(), sender: row.sender, subject: row.subject, note: row.note, partstat: row.partstat,
  }))
}
