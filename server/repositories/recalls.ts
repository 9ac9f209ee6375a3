// Recall due dates per patient and kind (issue 17 §1).
import type { Db } from '../utils/db'
import type { RecallKind } from '#shared/domain/recall'
import type { RecallDto } from '#shared/types/recall'

export async function setRecallDue(db: Db, patientId: number, kind: RecallKind, dueDate: string): Promise<void> {
  await db('recalls').insert({ patient_id: patientId, kind, due_date: dueDate, booked_visit_id: null, updated_at: new Date() })
    .onConflict(['patient_id', 'kind']).merge({ due_date: dueDate, booked_visit_id: null, updated_at: new Date() })
}

/** A booked visit of these kinds answers the patient's recalls of them. */
export async function markRecallsBooked(db: Db, patientId: number, kinds: readonly RecallKind[], visitId: number): Promise<number> {
  if (!kinds.length) return 0
  return db('recalls').where({ patient_id: patientId }).whereIn('kind', kinds).update({ booked_visit_id: visitId, updated_at: new Date() })
}

interface RecallRow {
  id: number
  patient_id: number
  kind: RecallKind
  due_date: string
  last_contact_at: Date | null
  first_name: string
  last_name: string
  email: string | null
  email_consent: number | boolean
  phone: string | null
  preferred_site_id: number | null
  last_visit_utc: Date | string | null
}

function toDto(row: RecallRow): RecallDto {
  return {
    id: row.id, patientId: row.patient_id, patientName: `${row.first_name} ${row.last_name}`, firstName: row.first_name, lastName: row.last_name, email: row.email, emailConsent: Boolean(row.email_consent),
    phone: row.phone, kind: row.kind, dueDate: row.due_date, lastContactUtc: row.last_contact_at ? row.last_contact_at.toISOString() : null,
    lastVisitUtc: row.last_visit_utc ? new Date(row.last_visit_utc).toISOString() : null, preferredSiteId: row.preferred_site_id,
  }
}

/**
 * Recalls due by `toDate` and not answered by a live booking, of the site's patients (preferred site,
 * or a visit there), at most 500, earliest due first.
 */
export async function listDueRecalls(db: Db, filter: { siteId: number; toDate: string; kind?: RecallKind; ids?: number[] }): Promise<RecallDto[]> {
  const query = db('recalls as r')
    .join('patients as p', 'p.id', 'r.patient_id')
    .leftJoin('visits as b', 'b.id', 'r.booked_visit_id')
    .whereNull('p.merged_into_id')
    .where('r.due_date', '<=', filter.toDate)
    .where((booked) => booked.whereNull('r.booked_visit_id').orWhereIn('b.state', ['cancelled', 'missed']))
    .where((site) => site.where('p.preferred_site_id', filter.siteId)
      .orWhere((none) => none.whereNull('p.preferred_site_id').whereExists(db('visits as v').whereRaw('v.patient_id = p.id').where('v.site_id', filter.siteId).select(db.raw('1')))))
    .select('r.id', 'r.patient_id', 'r.kind', 'r.due_date', 'r.last_contact_at', 'p.first_name', 'p.last_name', 'p.email', 'p.email_consent', 'p.phone', 'p.preferred_site_id')
    .select(db('visits as f').whereRaw('f.patient_id = p.id').where('f.state', 'finished').max('f.start_utc').as('last_visit_utc'))
    .orderBy([{ column: 'r.due_date' }, { column: 'r.id' }])
    .limit(500)
  if (filter.kind) query.where('r.kind', filter.kind)
  if (filter.ids) query.whereIn('r.id', filter.ids)
  return ((await query) as RecallRow[]).map(toDto)
}

export async function findRecall(db: Db, id: number): Promise<{ id: number; patientId: number; kind: RecallKind; dueDate: string } | undefined> {
  const row = await db('recalls').where({ id }).first('id', 'patient_id', 'kind', 'due_date')
  return row ? { id: row.id, patientId: row.patient_id, kind: row.kind, dueDate: row.due_date } : undefined
}

export async function noteRecallContact(db: Db, id: number, at: Date): Promise<void> {
  await db('recalls').where({ id }).update({ last_contact_at: at })
}
