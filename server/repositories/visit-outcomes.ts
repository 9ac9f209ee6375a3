// What Balance needs to know about how a site's visits turned out: state, start, and when a cancelled
// one was cancelled (the audit log's `visit_cancelled` row: the front desk's or the patient's link).
import type { Db } from '../utils/db'
import type { VisitOutcome } from '#shared/domain/visit-outcomes'
import { bySite, startingInSiteSpans, type SiteSpan } from './balance-inputs'
import { epochMs } from './epoch-ms'

interface OutcomeRow {
  site_id: number
  state: VisitOutcome['state']
  start_ms: number
  cancelled_at: Date | null
}

/**
 * Each site's visits starting in its own [fromMs, toMs), in one read for all the sites. The audit log
 * is looked up for cancelled visits only: no other visit's cancellation time is ever counted.
 */
export async function visitOutcomes(db: Db, spans: readonly SiteSpan[]): Promise<Map<number, VisitOutcome[]>> {
  if (!spans.length) return new Map()
  const cancelledAt = db('audit_log').max('audit_log.created_at')
    .where({ 'audit_log.entity': 'visit', 'audit_log.action': 'visit_cancelled' })
    .whereRaw('audit_log.entity_id = CAST(visits.id AS CHAR)')
  const rows: OutcomeRow[] = await db('visits')
    .where((any) => startingInSiteSpans(any, spans))
    .select('visits.site_id', 'visits.state', epochMs(db, 'visits.start_utc', 'start_ms'), db.raw(`CASE WHEN visits.state = 'cancelled' THEN (?) END AS cancelled_at`, [cancelledAt]))
  return bySite(rows, (row) => ({ state: row.state, startMs: Number(row.start_ms), cancelledAtMs: row.cancelled_at ? new Date(row.cancelled_at).getTime() : null }))
}
