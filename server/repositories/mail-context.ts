// Everything one patient e-mail needs about its visit, read in one go.
import type { Db } from '../utils/db'
import type { ClockStyle, DateOrder } from '#shared/types/display'
import type { CancelRequestDto } from '#shared/types/outbox'
import type { VisitPlan } from '#shared/types/chair-time'
import type { VisitState } from '#shared/domain/visit-states'
import { parseJson } from './json'

export interface MailVisit {
  id: number
  state: VisitState
  startUtc: Date
  endUtc: Date
  icalUid: string
  icalSequence: number
  plan: VisitPlan
  cancelRequestedAt: Date | null
  rowVersion: number
}

export interface MailSite {
  id: number
  name: string
  address: string
  phone: string
  email: string
  timeZone: string
  clock: ClockStyle
  dateOrder: DateOrder
  /** The site's colour (#rrggbb), shown at the top of its e-mails. */
  colour: string
  settings: Record<string, unknown>
}

export interface MailPatient {
  id: number
  firstName: string
  lastName: string
  email: string | null
  emailConsent: boolean
  /** When the patient turned e-mail reminders off, or null. */
  remindersOffAt: Date | null
  /** yyyy-MM-dd or null; with the guardian's contact it decides who a message goes to (shared/domain/message-recipient.ts). */
  dateOfBirth: string | null
  phone: string | null
  guardianName: string | null
  guardianEmail: string | null
  guardianPhone: string | null
}

export interface MailContext {
  visit: MailVisit
  site: MailSite
  patient: MailPatient
}

/** A DATE column as yyyy-MM-dd, whether the driver hands a string or a Date. */
function dateText(value: unknown): string | null {
  if (value instanceof Date) return value.toISOString().slice(0, 10)
  return typeof value === 'string' && value ? value.slice(0, 10) : null
}

export async function loadMailContext(db: Db, visitId: number): Promise<MailContext | undefined> {
  const row = await db('visits')
    .join('sites', 'sites.id', 'visits.site_id')
    .join('patients', 'patients.id', 'visits.patient_id')
    .where('visits.id', visitId)
    .first(
      'visits.id', 'visits.state', 'visits.start_utc', 'visits.end_utc', 'visits.ical_uid',
      'visits.ical_sequence', 'visits.plan', 'visits.cancel_requested_at', 'visits.row_version',
      'sites.id as site_id', 'sites.name as site_name', 'sites.address as site_address', 'sites.phone as site_phone',
      'sites.email as site_email', 'sites.time_zone as site_time_zone', 'sites.settings as site_settings', 'sites.colour as site_colour',
      'sites.clock as site_clock', 'sites.date_order as site_date_order',
      'patients.id as patient_id', 'patients.first_name', 'patients.last_name', 'patients.email as patient_email', 'patients.email_consent', 'patients.reminders_off_at',
      'patients.date_of_birth', 'patients.phone as patient_phone', 'patients.guardian_name', 'patients.guardian_email', 'patients.guardian_phone',
    )
  if (!row) return undefined
  return {
    visit: {
      id: row.id, state: row.state, startUtc: row.start_utc, endUtc: row.end_utc, icalUid: row.ical_uid, icalSequence: row.ical_sequence,
      plan: parseJson<VisitPlan>(row.plan, {} as VisitPlan), cancelRequestedAt: row.cancel_requested_at, rowVersion: row.row_version,
    },
    site: {
      id: row.site_id, name: row.site_name, address: row.site_address, phone: row.site_phone, email: row.site_email,
      timeZone: row.site_time_zone, clock: row.site_clock, dateOrder: row.site_date_order, colour: row.site_colour, settings: parseJson<Record<string, unknown>>(row.site_settings, {}),
    },
    patient: { id: row.patient_id, firstName: row.first_name, lastName: row.last_name, email: row.patient_email, emailConsent: Boolean(row.email_consent), remindersOffAt: row.reminders_off_at ?? null,
      dateOfBirth: dateText(row.date_of_birth), phone: row.patient_phone ?? null,
      guardianName: row.guardian_name ?? null, guardianEmail: row.guardian_email ?? null, guardianPhone: row.guardian_phone ?? null,
    },
  }
}

/** The visit whose calendar event has this UID (RFC 5545 §3.8.4.7). */
export async function findVisitIdByUid(db: Db, icalUid: string): Promise<number | undefined> {
  const row = await db('visits').where({ ical_uid: icalUid }).first('id')
  return row?.id
}

/** The patient confirmed through the signed link (a patient's change is not undone by staff: no previous state kept). */
export async function confirmVisit(db: Db, id: number, rowVersion: number): Promise<boolean> {
  const changed = await db('visits').where({ id, row_version: rowVersion, state: 'booked' })
    .update({ state: 'confirmed', confirmed_at: new Date(), previous_state: null, state_changed_at: null, row_version: rowVersion + 1, updated_at: db.fn.now(3) })
  return changed === 1
}

/** The patient turned e-mail reminders off (true when this call did it). */
export async function turnRemindersOff(db: Db, patientId: number): Promise<boolean> {
  return (await db('patients').where({ id: patientId }).whereNull('reminders_off_at').update({ reminders_off_at: new Date() })) === 1
}

/** The patient asked to cancel; the front desk decides (or the site cancels at once, see the service). */
export async function recordCancelRequest(db: Db, id: number): Promise<void> {
  await db('visits').where({ id }).whereNull('cancel_requested_at').update({ cancel_requested_at: new Date(), updated_at: db.fn.now(3) })
}

/** Upcoming live visits whose patient asked to cancel, soonest first. */
export async function listCancelRequests(db: Db, filter: { siteIds: number[] | 'all'; siteId?: number; nowMs: number }): Promise<CancelRequestDto[]> {
  const query = db('visits').join('patients', 'patients.id', 'visits.patient_id')
    .whereNotNull('visits.cancel_requested_at').whereIn('visits.state', ['booked', 'confirmed'])
    .where('visits.end_utc', '>', new Date(filter.nowMs)).orderBy('visits.start_utc').limit(200)
    .select('visits.id', 'visits.site_id', 'visits.start_utc', 'visits.state', 'visits.cancel_requested_at', 'visits.row_version', 'patients.first_name', 'patients.last_name')
  if (filter.siteIds !== 'all') query.whereIn('visits.site_id', filter.siteIds)
  if (filter.siteId !== undefined) query.where('visits.site_id', filter.siteId)
  return (await query).map((row) => ({
    visitId: row.id, siteId: row.site_id, patientName: `${row.first_name} ${row.last_name}`, startUtc: row.start_utc.toISOString(),
    state: row.state, requestedAt: row.cancel_requested_at.toISOString(), rowVersion: row.row_version,
  }))
}
