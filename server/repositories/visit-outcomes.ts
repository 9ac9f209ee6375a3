// What Balance needs to know about how a site's visits turned out: state, start, and when a cancelled
// one was cancelled (the audit log's `visit_cancelled` row: the front desk's or the patient's link).
import type { Db } from '../utils/db'
import type { VisitOutcome } from '#shared/domain/visit-outcomes'

interface OutcomeRow {
  state: VisitOutcome['state']
  start_utc: Date
  cancelled_at: Date | null
}

export async function visitOutcomes(db: Db, siteId: number, fromMs: number, toMs: number): Promise<VisitOutcome[]> {
  const cancelledAt = db('audit_log').max('audit_log.created_at')
    .where({ 'audit_log.entity': 'visit', 'audit_log.action': 'visit_cancelled' })
    .whereRaw('audit_log.entity_id = CAST(visits.id AS CHAR)')
  const rows: OutcomeRow[] = await db('visits')
    .where('visits.site_id', siteId)
    .where('visits.start_utc', '>=', new Date(fromMs))
    .where('visits.start_utc', '<', new Date(toMs))
    .select('visits.state', 'visits.start_utc', db.raw('(?) AS cancelled_at', [cancelledAt]))
  return rows.map((row) => ({ state: row.state, startMs: row.start_utc.getTime(), cancelledAtMs: row.cancelled_at ? new Date(row.cancelled_at).getTime() : null }))
}
