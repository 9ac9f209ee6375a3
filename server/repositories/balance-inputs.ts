// What Balance reads beyond chair time (issue 17 §3): the visits that gave their time back and the
// bookings that took it again (refilled time), and the visits of a site's chairs with the patient's
// contact details and their providers' hands-on time (consolidation suggestions).
import type { Knex } from 'knex'
import type { Db } from '../utils/db'
import { earliestOverlappingStart } from '#shared/domain/input-bounds'
import { epochMs } from './epoch-ms'
import type { FreedVisit, LaterVisit } from '#shared/domain/balance-refill'
import type { ProviderBusy } from '#shared/domain/balance-suggestions'

/** A site and its range of instants (its own local dates' edges). */
export interface SiteSpan { siteId: number; fromMs: number; toMs: number }

/**
 * Visits of each site starting inside its own span: an OR of (site_id, start_utc) ranges, one index
 * range each. Written as SQL text with bound values: built with the query builder, 61 sites' nested
 * conditions cost more CPU than the read (issue 19 §3).
 */
export function startingInSiteSpans(query: Knex.QueryBuilder, spans: readonly SiteSpan[]): void {
  query.whereRaw(spans.map(() => '(visits.site_id = ? AND visits.start_utc >= ? AND visits.start_utc < ?)').join(' OR '),
    spans.flatMap((span) => [span.siteId, new Date(span.fromMs), new Date(span.toMs)]))
}

/** Rows sorted into their sites (`site_id`), each turned into what the caller needs. */
export function bySite<Row extends { site_id: number }, T>(rows: readonly Row[], map: (row: Row) => T): Map<number, T[]> {
  const sites = new Map<number, T[]>()
  for (const row of rows) {
    const list = sites.get(row.site_id)
    if (list) list.push(map(row))
    else sites.set(row.site_id, [map(row)])
  }
  return sites
}

/**
 * Cancelled and missed visits of each site starting in its span, with when their time was freed:
 * a cancellation's `visit_cancelled` audit row (the last one), else the last state change.
 */
export async function freedVisits(db: Db, spans: readonly SiteSpan[]): Promise<Map<number, FreedVisit[]>> {
  if (!spans.length) return new Map()
  const cancelledAt = db('audit_log').max('audit_log.created_at')
    .where({ 'audit_log.entity': 'visit', 'audit_log.action': 'visit_cancelled' })
    .whereRaw('audit_log.entity_id = CAST(visits.id AS CHAR)')
  const rows: Array<{ site_id: number; id: number; operatory_id: number; start_ms: number; end_ms: number; state: string; state_changed_at: Date | null; cancelled_at: Date | string | null }> = await db('visits')
    .whereIn('visits.state', ['cancelled', 'missed'])
    .where((any) => startingInSiteSpans(any, spans))
    .select('visits.site_id', 'visits.id', 'visits.operatory_id', epochMs(db, 'visits.start_utc', 'start_ms'), epochMs(db, 'visits.end_utc', 'end_ms'), 'visits.state', 'visits.state_changed_at', db.raw('(?) AS cancelled_at', [cancelledAt]))
  return bySite(rows, (row) => {
    const changedAt = row.state === 'cancelled' && row.cancelled_at ? new Date(row.cancelled_at) : row.state_changed_at
    const startMs = Number(row.start_ms)
    return { visitId: row.id, operatoryId: row.operatory_id, startMs, endMs: Number(row.end_ms), freedAtMs: changedAt ? changedAt.getTime() : startMs }
  })
}

/** Visits not cancelled in each site's chairs overlapping its span, with when each was booked. */
export async function bookedVisits(db: Db, spans: readonly SiteSpan[]): Promise<Map<number, LaterVisit[]>> {
  if (!spans.length) return new Map()
  const rows: Array<{ site_id: number; id: number; operatory_id: number; start_ms: number; end_ms: number; created_ms: number }> = await db('visits')
    .whereNot('state', 'cancelled')
    // SQL text with bound values, as in startingInSiteSpans.
    .whereRaw(spans.map(() => '(site_id = ? AND start_utc < ? AND start_utc > ? AND end_utc > ?)').join(' OR '),
      spans.flatMap((span) => [span.siteId, new Date(span.toMs), earliestOverlappingStart(span.fromMs), new Date(span.fromMs)]))
    .select('site_id', 'id', 'operatory_id', epochMs(db, 'start_utc', 'start_ms'), epochMs(db, 'end_utc', 'end_ms'), epochMs(db, 'created_at', 'created_ms'))
  return bySite(rows, (row) => ({ visitId: row.id, operatoryId: row.operatory_id, startMs: Number(row.start_ms), endMs: Number(row.end_ms), createdAtMs: Number(row.created_ms) }))
}

export interface ChairVisit {
  id: number
  operatoryId: number
  providerId: number
  startMs: number
  endMs: number
  state: string
  stranded: boolean
  patientName: string
  patientPhone: string | null
  patientEmail: string | null
  emailConsent: boolean
}

/** Live visits (not cancelled, not missed) in the site's chairs overlapping [fromMs, toMs), at most 2,000. */
export async function liveChairVisits(db: Db, siteId: number, fromMs: number, toMs: number): Promise<ChairVisit[]> {
  const rows = await db('visits').join('patients', 'patients.id', 'visits.patient_id')
    .where('visits.site_id', siteId).whereNotIn('visits.state', ['cancelled', 'missed'])
    .where('visits.start_utc', '<', new Date(toMs)).where('visits.start_utc', '>', earliestOverlappingStart(fromMs)).where('visits.end_utc', '>', new Date(fromMs))
    .orderBy('visits.start_utc').limit(2000)
    .select('visits.id', 'visits.operatory_id', 'visits.provider_id', 'visits.start_utc', 'visits.end_utc', 'visits.state', 'visits.stranded_reason',
      'patients.first_name', 'patients.last_name', 'patients.phone', 'patients.email', 'patients.email_consent')
  return rows.map((row: Record<string, unknown>) => ({
    id: row.id as number, operatoryId: row.operatory_id as number, providerId: row.provider_id as number,
    startMs: (row.start_utc as Date).getTime(), endMs: (row.end_utc as Date).getTime(), state: row.state as string, stranded: row.stranded_reason !== null,
    patientName: `${row.first_name} ${row.last_name}`, patientPhone: (row.phone as string | null) ?? null, patientEmail: (row.email as string | null) ?? null, emailConsent: Boolean(row.email_consent),
  }))
}

/** Hands-on time of these providers in any chair (their live visits' segments) overlapping [fromMs, toMs). */
export async function providersHandsOn(db: Db, providerIds: number[], fromMs: number, toMs: number): Promise<ProviderBusy[]> {
  if (!providerIds.length) return []
  const rows: Array<{ visit_id: number; provider_id: number; start_utc: Date; end_utc: Date }> = await db('visit_segments')
    .whereIn('provider_id', providerIds).where('kind', 'hands_on')
    .where('start_utc', '<', new Date(toMs)).where('start_utc', '>', earliestOverlappingStart(fromMs)).where('end_utc', '>', new Date(fromMs))
    .select('visit_id', 'provider_id', 'start_utc', 'end_utc')
  return rows.map((row) => ({ visitId: row.visit_id, providerId: row.provider_id, startMs: new Date(row.start_utc).getTime(), endMs: new Date(row.end_utc).getTime() }))
}
