// Who did what, when, with the state before and after.
import type { Db } from '../utils/db'

export interface AuditEntry {
  userId: number | null
  action: string
  entity: string
  entityId?: string | number | null
  before?: unknown
  after?: unknown
  ip?: string | null
}

export async function writeAudit(db: Db, entry: AuditEntry): Promise<void> {
  await db('audit_log').insert({
    user_id: entry.userId,
    action: entry.action,
    entity: entry.entity,
    entity_id: entry.entityId === undefined || entry.entityId === null ? null : String(entry.entityId),
    before: entry.before === undefined ? null : JSON.stringify(entry.before),
    after: entry.after === undefined ? null : JSON.stringify(entry.after),
    ip: entry.ip ?? null,
  })
}
