// Recall due dates per patient and kind (issue 17 §1).
import type { Db } from '../utils/db'
import type { PatientRecallMonths, RecallKind } from '#shared/domain/recall'
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

/** A patient's own recall intervals (months per kind); kinds without a row follow the site. */
export async function findPatientRecallMonths(db: Db, patientId: number): Promise<PatientRecallMonths> {
  const rows = await db('patient_recall_intervals').where({ patient_id: patientId }).select('kind', 'months') as Array<{ kind: RecallKind; months: number }>
  return Object.fromEntries(rows.map((row) => [row.kind, row.months]))
}

/** Set (a number) or clear (null) the patient's own interval for each kind given. */
export async function savePatientRecallMonths(db: Db, patientId: number, months: Partial<Record<RecallKind, number | null>>, userId: number): Promise<void> {
  for (const [kind, value] of Object.entries(months) as Array<[RecallKind, number | null | undefined]>) {
    if (value === undefined) continue
    if (value === null) {
      await db('patient_recall_intervals').where({ patient_id: patientId, kind }).delete()
      continue
    }
    await db('patient_recall_intervals').insert({ patient_id: patientId, kind, months: value, updated_by: userId, updated_at: new Date() })
      .onConflict(['patient_id', 'kind']).merge({ months: value, updated_by: userId, updated_at: new Date() })
  }
}

/** The recall behind a recall-page link, with what the page needs of the patient and the booking. */
export async function findRecallForPage(db: Db, id: number): Promise<{ id: number; patientId: number; kind: RecallKind; dueDate: string; bookedVisitId: number | null; bookedVisitLive: boolean; firstName: string; preferredSiteId: number | null; mergedIntoId: number | null } | undefined> {
  const row = await db('recalls as r').join('patients as p', 'p.id', 'r.patient_id').leftJoin('visits as b', 'b.id', 'r.booked_visit_id')
    .where('r.id', id)
    .first('r.id', 'r.patient_id', 'r.kind', 'r.due_date', 'r.booked_visit_id', 'b.state as booked_state', 'p.first_name', 'p.preferred_site_id', 'p.merged_into_id')
  if (!row) return undefined
  return {
    id: row.id, patientId: row.patient_id, kind: row.kind, dueDate: row.due_date, bookedVisitId: row.booked_visit_id,
    bookedVisitLive: row.booked_visit_id !== null && row.booked_state !== null && !['cancelled', 'missed'].includes(row.booked_state),
    firstName: row.first_name, preferredSiteId: row.preferred_site_id, mergedIntoId: row.merged_into_id,
  }
}

/** Template codes of the patient's latest finished visits, newest first (the recall page's plan). */
export async function recentFinishedTemplateCodes(db: Db, patientId: number): Promise<string[]> {
  const rows = await db('visits').where({ patient_id: patientId, state: 'finished' }).orderBy('start_utc', 'desc').limit(10).select('plan') as Array<{ plan: string | { items?: Array<{ templateCode?: string }> } }>
  const codes: string[] = []
  for (const row of rows) {
    let plan: { items?: Array<{ templateCode?: string }> } = {}
    try { plan = typeof row.plan === 'string' ? JSON.parse(row.plan) : row.plan } catch { continue }
    for (const item of plan.items ?? []) if (item.templateCode) codes.push(item.templateCode)
  }
  return codes
}
