// Who did what, when, with the state before and after.
import type { Db } from '../utils/db'
import type { AuditEntryDto } from '#shared/types/audit'
import { writeOnly, type Statement } from './round-trip'

export interface AuditEntry {
  userId: number | null
  action: string
  entity: string
  entityId?: string | number | null
  before?: unknown
  after?: unknown
  ip?: string | null
}

function auditRow(entry: AuditEntry) {
  return {
    user_id: entry.userId,
    action: entry.action,
    entity: entry.entity,
    entity_id: entry.entityId === undefined || entry.entityId === null ? null : String(entry.entityId),
    before: entry.before === undefined ? null : JSON.stringify(entry.before),
    after: entry.after === undefined ? null : JSON.stringify(entry.after),
    ip: entry.ip ?? null,
  }
}

export async function writeAudit(db: Db, entry: AuditEntry): Promise<void> {
  await db('audit_log').insert(auditRow(entry))
}

/** The same write as a statement, to go with others in one round trip. */
export function auditStatement(db: Db, entry: AuditEntry): Statement<void> {
  return writeOnly(db('audit_log').insert(auditRow(entry)))
}

export interface AuditFilter {
  userId?: number
  patientId?: number
  visitId?: number
  siteId?: number
  fromUtc?: Date
  toUtc?: Date
  action?: string
}

interface AuditRow {
  id: number
  created_at: Date
  user_id: number | null
  user_name: string | null
  action: string
  entity: string
  entity_id: string | null
  ip: string | null
  before: unknown
  after: unknown
}

const parsed = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : value)

/** One page of the audit log, newest first, with the total for paging. */
export async function listAudit(db: Db, filter: AuditFilter, page: number, pageSize: number): Promise<{ rows: AuditEntryDto[]; total: number }> {
  const query = db('audit_log').leftJoin('users', 'users.id', 'audit_log.user_id')
  if (filter.userId !== undefined) query.where('audit_log.user_id', filter.userId)
  if (filter.action !== undefined) query.where('audit_log.action', filter.action)
  if (filter.fromUtc) query.where('audit_log.created_at', '>=', filter.fromUtc)
  if (filter.toUtc) query.where('audit_log.created_at', '<', filter.toUtc)
  if (filter.visitId !== undefined) query.where({ 'audit_log.entity': 'visit', 'audit_log.entity_id': String(filter.visitId) })
  if (filter.patientId !== undefined) {
    const patientId = filter.patientId
    query.where((either) => either
      .where({ 'audit_log.entity': 'patient', 'audit_log.entity_id': String(patientId) })
      .orWhere((visit) => visit.where('audit_log.entity', 'visit')
        .whereIn('audit_log.entity_id', db('visits').where('patient_id', patientId).select(db.raw('CAST(id AS CHAR)')))))
  }
  if (filter.siteId !== undefined) {
    const siteId = filter.siteId
    query.where((either) => either
      .where({ 'audit_log.entity': 'site', 'audit_log.entity_id': String(siteId) })
      .orWhere((visit) => visit.where('audit_log.entity', 'visit')
        .whereIn('audit_log.entity_id', db('visits').where('site_id', siteId).select(db.raw('CAST(id AS CHAR)'))))
      .orWhere((upload) => upload.where('audit_log.entity', 'patient_import')
        .whereIn('audit_log.entity_id', db('patient_imports').where('site_id', siteId).select(db.raw('CAST(id AS CHAR)')))))
  }
  const [{ total }] = await query.clone().count({ total: '*' }) as unknown as [{ total: number }]
  const rows = (await query.orderBy('audit_log.id', 'desc').limit(pageSize).offset((page - 1) * pageSize)
    .select('audit_log.*', 'users.name as user_name')) as AuditRow[]
  return {
    total: Number(total),
    rows: rows.map((row) => ({
      id: Number(row.id), atUtc: row.created_at.toISOString(), userId: row.user_id, userName: row.user_name, action: row.action,
      entity: row.entity, entityId: row.entity_id, ip: row.ip, before: parsed(row.before), after: parsed(row.after),
    })),
  }
}
