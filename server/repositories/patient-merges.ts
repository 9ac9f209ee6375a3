// Merging two patient records (issue 16 §2): what moves, and the merge record.
import type { ClockStyle, DateOrder } from '#shared/types/display'
import type { Db } from '../utils/db'
import { MAX_VISIT_MINUTES } from '#shared/domain/input-bounds'

export interface OverlapRow {
  survivor_visit_id: number
  merged_visit_id: number
  start_utc: Date
  time_zone: string
  clock: ClockStyle
  date_order: DateOrder
  site_name: string
}

/** Live visits of the two patients that overlap in time (a person cannot be in two chairs at once). */
export async function overlappingVisits(db: Db, survivorId: number, mergedId: number): Promise<OverlapRow[]> {
  return db('visits as a')
    // Both last at most MAX_VISIT_MINUTES, so b starts after a's start minus that: the (patient_id, start_utc) index bounds b.
    .join('visits as b', (on) => on.on('a.start_utc', '<', 'b.end_utc').andOn('a.end_utc', '>', 'b.start_utc')
      .andOn('b.start_utc', '>', db.raw('a.start_utc - INTERVAL ? MINUTE', [MAX_VISIT_MINUTES])))
    .join('sites', 'sites.id', 'a.site_id')
    .where('a.patient_id', survivorId).where('b.patient_id', mergedId)
    .whereNotIn('a.state', ['cancelled', 'missed']).whereNotIn('b.state', ['cancelled', 'missed'])
    .orderBy('a.start_utc').limit(5)
    .select({ survivor_visit_id: 'a.id', merged_visit_id: 'b.id', start_utc: 'a.start_utc', time_zone: 'sites.time_zone', clock: 'sites.clock', date_order: 'sites.date_order', site_name: 'sites.name' })
}

/** Gives the merged-away patient's visits to the survivor; their outbox rows follow the visits. */
export async function moveVisits(db: Db, fromId: number, toId: number): Promise<{ visitIds: number[]; outboxIds: number[] }> {
  const visitIds = (await db('visits').where({ patient_id: fromId }).orderBy('id').pluck('id')) as number[]
  if (!visitIds.length) return { visitIds, outboxIds: [] }
  await db('visits').whereIn('id', visitIds).update({ patient_id: toId, row_version: db.raw('row_version + 1') })
  const outboxIds = (await db('outbox').whereIn('visit_id', visitIds).orderBy('id').pluck('id')) as number[]
  return { visitIds, outboxIds }
}

/**
 * Recall and waitlist follow the person: open waitlist entries move to the survivor; a recall or a
 * recall interval of a kind the survivor has none of moves, and where both have one the survivor's is
 * kept (the merged-away one is removed, so the merged-away id never shows on the Recall screen).
 */
export async function moveRecallAndWaitlist(db: Db, fromId: number, toId: number): Promise<{ waitlistEntries: number; recalls: number; recallIntervals: number }> {
  const waitlistEntries = await db('waitlist_entries').where({ patient_id: fromId }).update({ patient_id: toId })
  const moveKinds = async (table: 'recalls' | 'patient_recall_intervals') => {
    const taken = (await db(table).where({ patient_id: toId }).pluck('kind')) as string[]
    const moved = await db(table).where({ patient_id: fromId }).whereNotIn('kind', taken.length ? taken : ['']).update({ patient_id: toId })
    await db(table).where({ patient_id: fromId }).delete()
    return moved
  }
  return { waitlistEntries, recalls: await moveKinds('recalls'), recallIntervals: await moveKinds('patient_recall_intervals') }
}

/** The merged-away record's audit trail is filed under the survivor; returns how many rows moved. */
export async function moveAuditTrail(db: Db, fromId: number, toId: number): Promise<number> {
  return db('audit_log').where({ entity: 'patient', entity_id: String(fromId) }).update({ entity_id: String(toId) })
}

/** Marks the record merged, and points records merged into it earlier at the survivor too. */
export async function markMerged(db: Db, mergedId: number, survivorId: number): Promise<void> {
  await db('patients').where({ merged_into_id: mergedId }).update({ merged_into_id: survivorId })
  await db('patients').where({ id: mergedId }).update({ merged_into_id: survivorId, row_version: db.raw('row_version + 1'), updated_at: db.fn.now(3) })
}

export interface MergeRecord {
  survivorId: number
  mergedId: number
  userId: number
  choices: unknown
  mergedBefore: unknown
  survivorBefore: unknown
  moved: unknown
}

export async function insertMerge(db: Db, merge: MergeRecord): Promise<number> {
  const [id] = await db('patient_merges').insert({
    survivor_id: merge.survivorId, merged_id: merge.mergedId, user_id: merge.userId, choices: JSON.stringify(merge.choices),
    merged_before: JSON.stringify(merge.mergedBefore), survivor_before: JSON.stringify(merge.survivorBefore), moved: JSON.stringify(merge.moved),
  })
  return id as number
}
