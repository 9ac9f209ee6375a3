// Patients: search for booking and quick registration.
import type { DateOrder } from '#shared/types/display'
import { parseDateInput } from '#shared/utils/display-time'
import type { Db } from '../utils/db'
import type { PatientDto } from '#shared/types/visits'

export interface PatientRow {
  id: number
  first_name: string
  last_name: string
  /** DATE: 'YYYY-MM-DD' (db/connection.ts) */
  date_of_birth: string
  email: string | null
  phone: string | null
  preferred_site_id: number | null
  email_consent: number
}

/** Typed % and _ are letters to search for, not wildcards. */
export function escapeLike(text: string): string {
  return text.replace(/[\\%_]/g, '\\$&')
}

export function toPatientDto(row: PatientRow): PatientDto {
  return {
    id: row.id, firstName: row.first_name, lastName: row.last_name, dateOfBirth: row.date_of_birth,
    email: row.email, phone: row.phone, preferredSiteId: row.preferred_site_id, emailConsent: Boolean(row.email_consent),
  }
}

export async function findPatient(db: Db, id: number): Promise<PatientDto | undefined> {
  const row = await db<PatientRow>('patients').where({ id }).first()
  return row ? toPatientDto(row) : undefined
}

/**
 * Matches names (each word), a birth date (ISO 'YYYY-MM-DD', or as the screen's site writes it:
 * '09/13/1973' month first by default), digits of a phone number or an e-mail.
 */
export async function searchPatients(db: Db, text: string, limit: number, dateOrder: DateOrder = 'month-day-year'): Promise<PatientDto[]> {
  const query = db<PatientRow>('patients').orderBy(['last_name', 'first_name']).limit(limit)
  const digits = text.replace(/\D/g, '')
  const birthDate = parseDateInput(text, dateOrder)
  if (birthDate) {
    query.where('date_of_birth', birthDate)
  } else if (text.includes('@')) {
    query.where('email', 'like', `%${escapeLike(text)}%`)
  } else if (digits.length >= 4 && digits.length === text.replace(/[\s()+\-.]/g, '').length) {
    query.whereRaw("REGEXP_REPLACE(phone, '[^0-9]', '') LIKE ?", [`%${digits}%`])
  } else {
    for (const word of text.split(/\s+/).filter(Boolean)) {
      query.where((name) => name.where('first_name', 'like', `${escapeLike(word)}%`).orWhere('last_name', 'like', `${escapeLike(word)}%`))
    }
  }
  return (await query).map(toPatientDto)
}

export async function insertPatient(db: Db, patient: Omit<PatientDto, 'id'>): Promise<number> {
  const [id] = await db('patients').insert({
    first_name: patient.firstName, last_name: patient.lastName, date_of_birth: patient.dateOfBirth,
    email: patient.email, phone: patient.phone, preferred_site_id: patient.preferredSiteId, email_consent: patient.emailConsent,
  })
  return id as number
}
