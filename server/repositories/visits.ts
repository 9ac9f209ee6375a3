// Visits and their timeline segments. Conflict queries use the overlap predicate
// start < :end AND end > :start on live segments (cancelled visits keep none).
import type { Db } from '../utils/db'
import { earliestOverlappingStart } from '#shared/domain/input-bounds'
import type { VisitDto, SegmentDto } from '#shared/types/visits'
import type { VisitPlan, StepKind } from '#shared/types/chair-time'
import type { VisitState } from '#shared/domain/visit-states'
import type { ClockStyle, DateOrder } from '#shared/types/display'
import { parseJson } from './json'
import { allOf, insertIdOf, rowsOf, statement, writeOnly, type Statement } from './round-trip'

export interface VisitRow {
  id: number
  site_id: number
  operatory_id: number
  provider_id: number
  patient_id: number
  start_utc: Date
  end_utc: Date
  state: VisitState
  plan: string
  note: string
  cancel_reason: string | null
  cancel_requested_at?: Date | null
  ical_uid: string
  ical_sequence: number
  row_version: number
  /** Set while the visit is stranded by a change (issue 13): why it no longer holds. */
  stranded_reason?: string | null
  /** The state before the last staff change (for undo), and when that change was made. */
  previous_state: VisitState | null
  state_changed_at: Date | null
  anaesthetic_given_at: Date | null
}

interface SegmentRow {
  visit_id: number
  kind: StepKind
  label: string
  operatory_id: number
  provider_id: number
  start_utc: Date
  end_utc: Date
}

export interface NewSegment {
  kind: StepKind
  label: string
  operatoryId: number
  providerId: number
  startMs: number
  endMs: number
}

export interface NewVisit {
  siteId: number
  operatoryId: number
  providerId: number
  patientId: number
  startMs: number
  endMs: number
  plan: VisitPlan
  note: string
  icalUid: string
  userId: number | null
}

function visitRow(visit: NewVisit) {
  return {
    site_id: visit.siteId, operatory_id: visit.operatoryId, provider_id: visit.providerId, patient_id: visit.patientId,
    start_utc: new Date(visit.startMs), end_utc: new Date(visit.endMs), plan: JSON.stringify(visit.plan), note: visit.note,
    ical_uid: visit.icalUid, created_by: visit.userId, updated_by: visit.userId,
  }
}

/** A new visit's insert as a statement answering its id, to go with others in one round trip. */
export function insertVisitStatement(db: Db, visit: NewVisit): Statement<number> {
  return statement(db('visits').insert(visitRow(visit)), insertIdOf)
}

function segmentRows(visitId: number, segments: NewSegment[]) {
  return segments.map((segment) => ({
    visit_id: visitId, kind: segment.kind, label: segment.label, operatory_id: segment.operatoryId,
    provider_id: segment.providerId, start_utc: new Date(segment.startMs), end_utc: new Date(segment.endMs),
  }))
}

export async function replaceSegments(db: Db, visitId: number, segments: NewSegment[], options: { isNew?: boolean } = {}): Promise<void> {
  if (!options.isNew) await db('visit_segments').where({ visit_id: visitId }).delete()
  if (!segments.length) return
  await db('visit_segments').insert(segmentRows(visitId, segments))
}

/** A new visit's segments as statements (none for no segments), to go with others in one round trip. */
export function newSegmentsStatement(db: Db, visitId: number, segments: NewSegment[]): Statement<unknown> {
  return allOf(segments.length ? [writeOnly(db('visit_segments').insert(segmentRows(visitId, segments)))] : [])
}

export async function findVisitRow(db: Db, id: number): Promise<VisitRow | undefined> {
  return db<VisitRow>('visits').where({ id }).first()
}

/** Updates only if nobody changed the visit since `rowVersion`; returns whether it did. */
export async function updateVisitIfVersion(db: Db, id: number, rowVersion: number, changes: Record<string, unknown>): Promise<boolean> {
  const updated = await db('visits').where({ id, row_version: rowVersion })
    .update({ ...changes, row_version: rowVersion + 1, updated_at: db.fn.now(3) })
  return updated === 1
}

function toSegmentDto(row: SegmentRow): SegmentDto {
  return {
    kind: row.kind, label: row.label, operatoryId: row.operatory_id, providerId: row.provider_id,
    startUtc: row.start_utc.toISOString(), endUtc: row.end_utc.toISOString(),
  }
}

export function toVisitDto(row: VisitRow, segments: SegmentRow[]): VisitDto {
  return {
    id: row.id, siteId: row.site_id, operatoryId: row.operatory_id, providerId: row.provider_id, patientId: row.patient_id,
    startUtc: row.start_utc.toISOString(), endUtc: row.end_utc.toISOString(), state: row.state, note: row.note,
    cancelReason: row.cancel_reason, cancelRequestedAt: row.cancel_requested_at ? row.cancel_requested_at.toISOString() : null, rowVersion: row.row_version, icalUid: row.ical_uid, icalSequence: row.ical_sequence,
    plan: parseJson<VisitPlan>(row.plan, {} as VisitPlan), segments: segments.map(toSegmentDto),
    previousState: row.previous_state ?? null, stateChangedAt: row.state_changed_at ? row.state_changed_at.toISOString() : null,
    anaestheticGivenAt: row.anaesthetic_given_at ? row.anaesthetic_given_at.toISOString() : null,
  }
}

/** The DTO of a visit just inserted, from what was written (saves reading it back). */
export function newVisitDto(id: number, visit: NewVisit, segments: NewSegment[]): VisitDto {
  return {
    id, siteId: visit.siteId, operatoryId: visit.operatoryId, providerId: visit.providerId, patientId: visit.patientId,
    startUtc: new Date(visit.startMs).toISOString(), endUtc: new Date(visit.endMs).toISOString(), state: 'booked', note: visit.note,
    cancelReason: null, cancelRequestedAt: null, rowVersion: 1, icalUid: visit.icalUid, icalSequence: 0, plan: visit.plan,
    previousState: null, stateChangedAt: null, anaestheticGivenAt: null,
    segments: segments.map((segment) => ({
      kind: segment.kind, label: segment.label, operatoryId: segment.operatoryId, providerId: segment.providerId,
      startUtc: new Date(segment.startMs).toISOString(), endUtc: new Date(segment.endMs).toISOString(),
    })),
  }
}

export async function findVisit(db: Db, id: number): Promise<VisitDto | undefined> {
  const row = await findVisitRow(db, id)
  if (!row) return undefined
  const segments = await db<SegmentRow>('visit_segments').where({ visit_id: id }).orderBy('start_utc')
  return toVisitDto(row, segments)
}

export interface SegmentClash {
  visitId: number
  startUtc: Date
  endUtc: Date
}

export interface ClashQuery {
  operatoryId: number
  startMs: number
  endMs: number
  providerId: number
  /** The new visit's hands_on intervals: the provider may not be hands_on elsewhere then. */
  handsOn: Array<{ startMs: number; endMs: number }>
  patientId: number
  /** The visit being moved, so it does not collide with itself. */
  exceptVisitId: number | null
}

export interface Clashes {
  operatory?: SegmentClash
  provider?: SegmentClash
  patient?: SegmentClash
}

/**
 * The first clash of each kind, in one statement: any live segment of another visit in the chair
 * overlapping [start, end); the provider hands_on elsewhere during the new hands_on time; another
 * live visit of the same patient overlapping [start, end). Overlap is start < :end AND end > :start,
 * with the lower bound start > :start − MAX_VISIT_MINUTES so each part reads a window of its
 * (chair | provider | patient, start_utc) index. Written as SQL text (through Knex's raw): it runs on
 * every booking and move, and building the three-part union with the query builder cost more CPU
 * than the statement itself. A statement, so a booking's insert can follow it in the same round trip.
 */
export function clashStatement(db: Db, clash: ClashQuery): Statement<Clashes> {
  const start = new Date(clash.startMs)
  const end = new Date(clash.endMs)
  const earliest = earliestOverlappingStart(clash.startMs)
  const except = clash.exceptVisitId
  const bindings: Array<number | Date> = []
  // The whole visit's times for the chair, not the one segment, so the message names the visit in the way.
  let sql = `(SELECT 'operatory' AS resource, visit_segments.visit_id AS visitId, visits.start_utc AS startUtc, visits.end_utc AS endUtc
    FROM visit_segments JOIN visits ON visits.id = visit_segments.visit_id
    WHERE visit_segments.operatory_id = ? AND visit_segments.start_utc < ? AND visit_segments.start_utc > ? AND visit_segments.end_utc > ?`
  bindings.push(clash.operatoryId, end, earliest, start)
  if (except !== null) { sql += ' AND visit_segments.visit_id <> ?'; bindings.push(except) }
  sql += ` ORDER BY visit_segments.start_utc LIMIT 1)
  UNION ALL (SELECT 'patient' AS resource, id AS visitId, start_utc AS startUtc, end_utc AS endUtc FROM visits
    WHERE patient_id = ? AND state NOT IN ('cancelled', 'missed') AND start_utc < ? AND start_utc > ? AND end_utc > ?`
  bindings.push(clash.patientId, end, earliest, start)
  if (except !== null) { sql += ' AND id <> ?'; bindings.push(except) }
  sql += ' ORDER BY start_utc LIMIT 1)'
  if (clash.handsOn.length) {
    const overlaps = clash.handsOn.map(() => '(start_utc < ? AND start_utc > ? AND end_utc > ?)').join(' OR ')
    sql += ` UNION ALL (SELECT 'provider' AS resource, visit_id AS visitId, start_utc AS startUtc, end_utc AS endUtc FROM visit_segments
    WHERE provider_id = ? AND kind = 'hands_on' AND (${overlaps})`
    bindings.push(clash.providerId)
    for (const interval of clash.handsOn) bindings.push(new Date(interval.endMs), earliestOverlappingStart(interval.startMs), new Date(interval.startMs))
    if (except !== null) { sql += ' AND visit_id <> ?'; bindings.push(except) }
    sql += ' ORDER BY start_utc LIMIT 1)'
  }
  return statement(db.raw(sql, bindings), (answer) => {
    const found: Clashes = {}
    for (const { resource, ...row } of rowsOf<SegmentClash & { resource: keyof Clashes }>(answer)) found[resource] = row
    return found
  })
}

export interface VisitListFilter {
  siteIds: number[] | 'all'
  siteId?: number
  providerId?: number
  patientId?: number
  fromMs: number
  toMs: number
  includeCancelled: boolean
}

export interface BoardRow extends VisitRow {
  patient_first_name: string
  patient_last_name: string
  patient_phone: string | null
  patient_alert: string | null
  provider_name: string
  site_tooth_notation: 'universal' | 'iso'
}

/** Visits overlapping [from, to) for a site or a provider, with patient and provider names. */
export async function listVisits(db: Db, filter: VisitListFilter): Promise<{ rows: BoardRow[]; segments: SegmentRow[] }> {
  const query = db('visits')
    .join('patients', 'patients.id', 'visits.patient_id')
    .join('providers', 'providers.id', 'visits.provider_id')
    .join('users', 'users.id', 'providers.user_id')
    .join('sites', 'sites.id', 'visits.site_id')
    .where('visits.start_utc', '<', new Date(filter.toMs)).where('visits.start_utc', '>', earliestOverlappingStart(filter.fromMs)).where('visits.end_utc', '>', new Date(filter.fromMs))
    .orderBy(['visits.start_utc', 'visits.id'])
    .select('visits.*', 'patients.first_name as patient_first_name', 'patients.last_name as patient_last_name', 'patients.phone as patient_phone', 'patients.alert_text as patient_alert', 'users.name as provider_name', 'sites.tooth_notation as site_tooth_notation')
  if (filter.siteId !== undefined) query.where('visits.site_id', filter.siteId)
  if (filter.providerId !== undefined) query.where('visits.provider_id', filter.providerId)
  if (filter.patientId !== undefined) query.where('visits.patient_id', filter.patientId)
  if (filter.siteIds !== 'all') query.whereIn('visits.site_id', filter.siteIds)
  if (!filter.includeCancelled) query.whereNot('visits.state', 'cancelled')
  const rows = (await query) as BoardRow[]
  const segments = rows.length
    ? await db<SegmentRow>('visit_segments').whereIn('visit_id', rows.map((row) => row.id)).orderBy('start_utc')
    : []
  return { rows, segments }
}

export function groupSegments(segments: SegmentRow[]): Map<number, SegmentRow[]> {
  const byVisit = new Map<number, SegmentRow[]>()
  for (const segment of segments) {
    const list = byVisit.get(segment.visit_id) ?? []
    list.push(segment)
    byVisit.set(segment.visit_id, list)
  }
  return byVisit
}

export interface OpenVisitRow { id: number; start_utc: Date; site_name: string; time_zone: string; clock: ClockStyle; date_order: DateOrder }

/** A provider's open visits (not finished, missed or cancelled) that end after `fromMs`, earliest first. */
export async function openVisitsOfProvider(db: Db, providerId: number, fromMs: number): Promise<OpenVisitRow[]> {
  return db('visits')
    .join('sites', 'sites.id', 'visits.site_id')
    .where('visits.provider_id', providerId)
    .where('visits.start_utc', '>', earliestOverlappingStart(fromMs)).where('visits.end_utc', '>', new Date(fromMs))
    .whereNotIn('visits.state', ['finished', 'missed', 'cancelled'])
    .orderBy(['visits.start_utc', 'visits.id'])
    .select('visits.id', 'visits.start_utc', 'sites.name as site_name', 'sites.time_zone', 'sites.clock', 'sites.date_order')
}
