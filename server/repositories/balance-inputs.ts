// What Balance reads beyond chair time (issue 17 §3): the visits that gave their time back and the
// bookings that took it again (refilled time), and the visits of a site's chairs with the patient's
// contact details and their providers' hands-on time (consolidation suggestions).
import type { Db } from '../utils/db'
import { earliestOverlappingStart } from '#shared/domain/input-bounds'
import type { FreedVisit, LaterVisit } from '#shared/domain/balance-refill'
import type { ProviderBusy } from '#shared/domain/balance-suggestions'

/**
 * Cancelled and missed visits of the site starting in [fromMs, toMs), with when their time was freed:
 * a cancellation's `visit_cancelled` audit row (the last one), else the last state change.
 */
export async function freedVisits(db: Db, siteId: number, fromMs: number, toMs: number): Promise<FreedVisit[]> {
  const cancelledAt = db('audit_log').max('audit_log.created_at')
    .where({ 'audit_log.entity': 'visit', 'audit_log.action': 'visit_cancelled' })
    .whereRaw('audit_log.entity_id = CAST(visits.id AS CHAR)')
  const rows: Array<{ id: number; operatory_id: number; start_utc: Date; end_utc: Date; state: string; state_changed_at: Date | null; cancelled_at: Date | string | null }> = await db('visits')
    .where('visits.site_id', siteId).whereIn('visits.state', ['cancelled', 'missed'])
    .where('visits.start_utc', '>=', new Date(fromMs)).where('visits.start_utc', '<', new Date(toMs))
    .select('visits.id', 'visits.operatory_id', 'visits.start_utc', 'visits.end_utc', 'visits.state', 'visits.state_changed_at', db.raw('(?) AS cancelled_at', [cancelledAt]))
  return rows.map((row) => {
    const changedAt = row.state === 'cancelled' && row.cancelled_at ? new Date(row.cancelled_at) : row.state_changed_at
    return { visitId: row.id, operatoryId: row.operatory_id, startMs: row.start_utc.getTime(), endMs: row.end_utc.getTime(), freedAtMs: (changedAt ?? row.start_utc).getTime() }
  })
}

/** Visits not cancelled in the site's chairs overlapping [fromMs, toMs), with when each was booked. */
export async function bookedVisits(db: Db, siteId: number, fromMs: number, toMs: number): Promise<LaterVisit[]> {
  const rows: Array<{ id: number; operatory_id: number; start_utc: Date; end_utc: Date; created_at: Date }> = await db('visits')
    .where('site_id', siteId).whereNot('state', 'cancelled')
    .where('start_utc', '<', new Date(toMs)).where('start_utc', '>', earliestOverlappingStart(fromMs)).where('end_utc', '>', new Date(fromMs))
    .select('id', 'operatory_id', 'start_utc', 'end_utc', 'created_at')
  return rows.map((row) => ({ visitId: row.id, operatoryId: row.operatory_id, startMs: row.start_utc.getTime(), endMs: row.end_utc.getTime(), createdAtMs: row.created_at.getTime() }))
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
