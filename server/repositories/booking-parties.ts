// The provider and the patient of a booking, read together in one round trip.
import type { Db } from '../utils/db'
import type { PatientDto } from '#shared/types/visits'
import type { ProviderKind } from '#shared/types/people'
import { ROLE_GROUPS } from '#shared/utils/access'
import { parseJson } from './json'
import { inOneTrip, rowsOf, statement, type Statement } from './round-trip'
import { toPatientDto, type PatientRow } from './patients'
import { toTextPatient, type TextPatient, type TextPatientRow } from './sms'

export interface ProviderDetails {
  id: number
  name: string
  /** users.role */
  kind: ProviderKind
  capabilities: string[]
  active: boolean
}

interface PartyColumns {
  provider_id: number | null
  provider_name: string
  provider_kind: ProviderDetails['kind']
  provider_capabilities: unknown
  provider_active: number
  open_waitlist_entry_ids: string | null
}

/**
 * Either is undefined when no such row exists. `textPatient` is the same patient row as the
 * outbox's channel choice reads it (numbers, consents, opt-out), so the booking need not read it again;
 * `openWaitlistEntryIds` the patient's open waitlist entries, which a booking may close (same reason).
 */
export type BookingParties = { provider?: ProviderDetails; patient?: PatientDto; textPatient?: TextPatient; openWaitlistEntryIds: number[] }

export async function findBookingParties(db: Db, providerId: number, patientId: number): Promise<BookingParties> {
  const [parties] = await inOneTrip(db, [bookingPartiesStatement(db, providerId, patientId)])
  return parties
}

/** The same read as a statement, to go with a booking's other first reads in one round trip. */
export function bookingPartiesStatement(db: Db, providerId: number, patientId: number): Statement<BookingParties> {
  const query = db.raw(`
    SELECT patients.*, provider.*,
      (SELECT GROUP_CONCAT(waitlist_entries.id ORDER BY waitlist_entries.id) FROM waitlist_entries
        WHERE waitlist_entries.patient_id = patients.id AND waitlist_entries.state = 'open') AS open_waitlist_entry_ids
    FROM patients
    LEFT JOIN (
      SELECT providers.id AS provider_id, users.name AS provider_name, users.role AS provider_kind,
        providers.capabilities AS provider_capabilities, (providers.active AND users.active) AS provider_active
      FROM providers JOIN users ON users.id = providers.user_id WHERE providers.id = ? AND users.role IN (?, ?)
    ) AS provider ON TRUE
    WHERE patients.id = ?`, [providerId, ...ROLE_GROUPS.providers, patientId])
  return statement(query, (answer) => partiesFrom(db, providerId, rowsOf<PatientRow & PartyColumns>(answer)[0]))
}

async function partiesFrom(db: Db, providerId: number, row: (PatientRow & PartyColumns) | undefined): Promise<BookingParties> {
  if (!row) {
    const provider = await findProviderDetails(db, providerId)
    return { provider, openWaitlistEntryIds: [] }
  }
  const { provider_id: id, provider_name: name, provider_kind: kind, provider_capabilities: capabilities, provider_active: active, open_waitlist_entry_ids: entryIds, ...patient } = row
  const merged = Boolean((patient as { merged_into_id?: number | null }).merged_into_id)
  return {
    provider: id === null ? undefined : { id, name, kind, capabilities: parseJson<string[]>(capabilities, []), active: Boolean(active) },
    // A record merged into another (issue 16 §2) is no longer booked: the survivor is.
    patient: merged ? undefined : toPatientDto(patient as PatientRow),
    textPatient: merged ? undefined : toTextPatient(patient as unknown as TextPatientRow),
    openWaitlistEntryIds: entryIds ? String(entryIds).split(',').map(Number) : [],
  }
}

export async function findProviderDetails(db: Db, providerId: number): Promise<ProviderDetails | undefined> {
  const row = await db('providers').join('users', 'users.id', 'providers.user_id').where('providers.id', providerId)
    .whereIn('users.role', ROLE_GROUPS.providers)
    .first('providers.id', 'users.name', 'users.role as kind', 'providers.capabilities', db.raw('(providers.active AND users.active) AS active'))
  return row ? { id: row.id, name: row.name, kind: row.kind, capabilities: parseJson<string[]>(row.capabilities, []), active: Boolean(row.active) } : undefined
}
