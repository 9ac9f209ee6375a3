// Waitlist entries and the offers made to them (issue 17 §2).
import type { Db } from '../utils/db'
import { earliestOverlappingStart } from '#shared/domain/input-bounds'
import type { OfferState, WaitlistEntryDto, WaitlistState } from '#shared/types/waitlist'
import type { PartOfDay } from '#shared/types/openings'
import type { Channel } from '#shared/domain/sms-channels'
import type { NewWaitlistEntryInput } from '#shared/schemas/waitlist'
import { parseJson } from './json'

interface EntryRow {
  id: number
  patient_id: number
  site_id: number
  site_ids: string
  items: string
  from_date: string
  to_date: string
  part_of_day: string
  notice_minutes: number
  priority: number
  note: string
  state: WaitlistState
  booked_visit_id: number | null
  created_at: Date
  first_name: string
  last_name: string
  email: string | null
  email_consent: number | boolean
}

const ENTRY_COLUMNS = ['w.*', 'p.first_name', 'p.last_name', 'p.email', 'p.email_consent']

function toEntryDto(row: EntryRow): WaitlistEntryDto {
  const items = parseJson<WaitlistEntryDto['items']>(row.items, [])
  return {
    id: row.id, patientId: row.patient_id, patientName: `${row.first_name} ${row.last_name}`, patientEmail: row.email, emailConsent: Boolean(row.email_consent),
    siteId: row.site_id, siteIds: parseJson<number[]>(row.site_ids, [row.site_id]), items,
    planLabel: items.map((item) => [item.templateCode ?? `#${item.templateId}`, item.tooth].filter(Boolean).join(' ')).join(', '),
    from: row.from_date, to: row.to_date, partOfDay: (row.part_of_day as PartOfDay) ?? 'any', noticeMinutes: row.notice_minutes,
    priority: row.priority, note: row.note, state: row.state, bookedVisitId: row.booked_visit_id, createdAtUtc: row.created_at.toISOString(),
  }
}

function entries(db: Db) {
  return db('waitlist_entries as w').join('patients as p', 'p.id', 'w.patient_id').select(ENTRY_COLUMNS)
}

export async function insertEntry(db: Db, input: NewWaitlistEntryInput & { siteIds: number[] }, userId: number): Promise<number> {
  const [id] = await db('waitlist_entries').insert({
    patient_id: input.patientId, site_id: input.siteId, site_ids: JSON.stringify(input.siteIds), items: JSON.stringify(input.items),
    from_date: input.from, to_date: input.to, part_of_day: input.partOfDay, notice_minutes: input.noticeMinutes,
    priority: input.priority, note: input.note, created_by: userId,
  })
  return id as number
}

export async function findEntry(db: Db, id: number, forUpdate = false): Promise<WaitlistEntryDto | undefined> {
  const query = entries(db).where('w.id', id).first()
  const row = (await (forUpdate ? query.forUpdate() : query)) as EntryRow | undefined
  return row ? toEntryDto(row) : undefined
}

export async function listEntries(db: Db, siteId: number, state: WaitlistState | 'all'): Promise<WaitlistEntryDto[]> {
  const query = entries(db).where('w.site_id', siteId).orderBy([{ column: 'w.priority' }, { column: 'w.created_at' }, { column: 'w.id' }]).limit(1000)
  if (state !== 'all') query.where('w.state', state)
  return ((await query) as EntryRow[]).map(toEntryDto)
}

/** Open entries that accept this site and whose date window reaches the given local dates. */
export async function openEntriesForSite(db: Db, siteId: number, fromDate: string, toDate: string): Promise<WaitlistEntryDto[]> {
  const rows = (await entries(db)
    .where('w.state', 'open')
    .where('w.from_date', '<=', toDate).where('w.to_date', '>=', fromDate)
    .whereRaw('JSON_CONTAINS(w.site_ids, ?)', [String(siteId)])) as EntryRow[]
  return rows.map(toEntryDto)
}

export async function closeEntry(db: Db, id: number, state: 'booked' | 'closed', details: { reason?: string; visitId?: number }): Promise<boolean> {
  const changed = await db('waitlist_entries').where({ id, state: 'open' }).update({
    state, closed_at: new Date(), closed_reason: details.reason ?? null, booked_visit_id: details.visitId ?? null,
  })
  return changed > 0
}

export interface OfferRow {
  id: number
  entry_id: number
  site_id: number
  operatory_id: number
  provider_id: number
  start_utc: Date
  end_utc: Date
  nonce: string
  expires_at: Date
  state: OfferState
  visit_id: number | null
}

export interface NewOffer {
  entryId: number
  siteId: number
  operatoryId: number
  providerId: number
  startMs: number
  endMs: number
  nonce: string
  expiresAtMs: number
  userId: number
}

export async function insertOffer(db: Db, offer: NewOffer): Promise<number> {
  const [id] = await db('offers').insert({
    entry_id: offer.entryId, site_id: offer.siteId, operatory_id: offer.operatoryId, provider_id: offer.providerId,
    start_utc: new Date(offer.startMs), end_utc: new Date(offer.endMs), nonce: offer.nonce, expires_at: new Date(offer.expiresAtMs), created_by: offer.userId,
  })
  return id as number
}

export async function findOffer(db: Db, id: number, forUpdate = false): Promise<OfferRow | undefined> {
  const query = db('offers').where({ id }).first()
  return (await (forUpdate ? query.forUpdate() : query)) as OfferRow | undefined
}

export async function setOfferState(db: Db, id: number, from: OfferState, to: OfferState, visitId?: number): Promise<boolean> {
  return (await db('offers').where({ id, state: from }).update({ state: to, answered_at: new Date(), ...(visitId ? { visit_id: visitId } : {}) })) > 0
}

/** The other open offers of the same chair time, once one was accepted. */
export async function markOthersTaken(db: Db, offer: OfferRow): Promise<number[]> {
  const ids = (await db('offers').where({ site_id: offer.site_id, operatory_id: offer.operatory_id, state: 'sent' })
    .where('start_utc', '<', offer.end_utc).where('start_utc', '>', earliestOverlappingStart(offer.start_utc.getTime())).where('end_utc', '>', offer.start_utc).whereNot('id', offer.id).pluck('id')) as number[]
  if (ids.length) await db('offers').whereIn('id', ids).where('state', 'sent').update({ state: 'taken', answered_at: new Date() })
  return ids
}

/** Entries with an open offer for this chair time (the gap panel says "offered"). */
export async function entriesOfferedAt(db: Db, siteId: number, operatoryId: number | null, fromMs: number, toMs: number): Promise<Map<number, Channel[]>> {
  const offers = (await db('offers').where({ site_id: siteId, state: 'sent' }).where((chair) => { if (operatoryId !== null) void chair.where('operatory_id', operatoryId) })
    .where('start_utc', '<', new Date(toMs)).where('start_utc', '>', earliestOverlappingStart(fromMs)).where('end_utc', '>', new Date(fromMs)).where('expires_at', '>', new Date()).select('id', 'entry_id')) as Array<{ id: number; entry_id: number }>
  const offered = new Map<number, Channel[]>(offers.map((offer) => [offer.entry_id, []]))
  if (!offers.length) return offered
  // The channels each open offer went by: its outbox rows (payload.offerId), one per channel.
  const entryOf = new Map(offers.map((offer) => [offer.id, offer.entry_id]))
  const sent = (await db('outbox').where({ site_id: siteId, kind: 'offer' })
    .whereRaw(`CAST(JSON_EXTRACT(payload, '$.offerId') AS UNSIGNED) IN (${offers.map(() => '?').join(', ')})`, offers.map((offer) => offer.id))
    .select('channel', db.raw("CAST(JSON_EXTRACT(payload, '$.offerId') AS UNSIGNED) AS offer_id"))) as Array<{ channel: Channel; offer_id: number }>
  for (const row of sent) {
    const channels = offered.get(entryOf.get(Number(row.offer_id)) ?? 0)
    if (channels && !channels.includes(row.channel)) channels.push(row.channel)
  }
  for (const channels of offered.values()) channels.sort()
  return offered
}
