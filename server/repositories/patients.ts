// Patients: search for booking and quick registration, the whole record, duplicates' candidates.
import type { Knex } from 'knex'
import type { DateOrder } from '#shared/types/display'
import { parseDateInput } from '#shared/utils/display-time'
import type { Db } from '../utils/db'
import type { PatientDto } from '#shared/types/visits'
import type { PatientRecordDto } from '#shared/types/patients'
import type { ConsentSource, PatientFieldsInput } from '#shared/schemas/patients'

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

export interface PatientRecordRow extends PatientRow {
  preferred_name: string | null
  address_street: string | null
  address_city: string | null
  address_region: string | null
  address_postal_code: string | null
  email_consent_at: Date | null
  email_consent_source: ConsentSource | null
  sms_consent: number
  sms_consent_at: Date | null
  sms_consent_source: ConsentSource | null
  guardian_name: string | null
  guardian_email: string | null
  guardian_phone: string | null
  notes: string
  alert_text: string | null
  row_version: number
  merged_into_id: number | null
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

export function toPatientRecordDto(row: PatientRecordRow): PatientRecordDto {
  return {
    ...toPatientDto(row),
    preferredName: row.preferred_name, addressStreet: row.address_street, addressCity: row.address_city,
    addressRegion: row.address_region, addressPostalCode: row.address_postal_code,
    emailConsentAt: row.email_consent_at?.toISOString() ?? null, emailConsentSource: row.email_consent_source,
    smsConsent: Boolean(row.sms_consent), smsConsentAt: row.sms_consent_at?.toISOString() ?? null, smsConsentSource: row.sms_consent_source,
    guardianName: row.guardian_name, guardianEmail: row.guardian_email, guardianPhone: row.guardian_phone,
    frontDeskNote: row.notes === '' ? null : row.notes, alertText: row.alert_text, rowVersion: row.row_version,
  }
}

export async function findPatient(db: Db, id: number): Promise<PatientDto | undefined> {
  const row = await db<PatientRow>('patients').where({ id }).first()
  return row ? toPatientDto(row) : undefined
}

/** The stored row, merged-away records included (their `merged_into_id` says where they went). */
export async function findPatientRow(db: Db, id: number, forUpdate = false): Promise<PatientRecordRow | undefined> {
  const query = db<PatientRecordRow>('patients').where({ id }).first()
  if (forUpdate) query.forUpdate()
  return query
}

/** Columns for a record's editable fields (consent dates and sources are the service's to set). */
export function patientColumns(fields: PatientFieldsInput): Record<string, unknown> {
  return {
    first_name: fields.firstName, last_name: fields.lastName, preferred_name: fields.preferredName ?? null,
    date_of_birth: fields.dateOfBirth, email: fields.email ?? null, phone: fields.phone ?? null,
    address_street: fields.addressStreet ?? null, address_city: fields.addressCity ?? null,
    address_region: fields.addressRegion ?? null, address_postal_code: fields.addressPostalCode ?? null,
    preferred_site_id: fields.preferredSiteId ?? null, email_consent: fields.emailConsent, sms_consent: fields.smsConsent,
    guardian_name: fields.guardianName ?? null, guardian_email: fields.guardianEmail ?? null, guardian_phone: fields.guardianPhone ?? null,
    notes: fields.frontDeskNote ?? '', alert_text: fields.alertText ?? null,
  }
}

/** Writes the record if its version is still `rowVersion`; false when someone saved in between. */
export async function updatePatientIfVersion(db: Db, id: number, rowVersion: number, columns: Record<string, unknown>): Promise<boolean> {
  const changed = await db('patients').where({ id, row_version: rowVersion })
    .update({ ...columns, row_version: db.raw('row_version + 1'), updated_at: db.fn.now(3) })
  return changed === 1
}

/** Records sharing an e-mail, a phone or a birth date with any of the people (merged-away ones left out). */
export async function duplicateCandidates(db: Db, people: { email?: string | null; phone?: string | null; dateOfBirth: string }[]): Promise<PatientDto[]> {
  const emails = [...new Set(people.map((person) => person.email).filter((email): email is string => Boolean(email)))]
  const phones = [...new Set(people.map((person) => person.phone).filter((phone): phone is string => Boolean(phone)))]
  const births = [...new Set(people.map((person) => person.dateOfBirth))]
  const found = new Map<number, PatientDto>()
  const chunk = 1000
  for (const [column, values] of [['email', emails], ['phone', phones], ['date_of_birth', births]] as const) {
    for (let start = 0; start < values.length; start += chunk) {
      const rows = await db<PatientRow>('patients').whereNull('merged_into_id').whereIn(column, values.slice(start, start + chunk))
      for (const row of rows) found.set(row.id, toPatientDto(row))
    }
  }
  return [...found.values()]
}

/**
 * Matches names (each word), a birth date (ISO 'YYYY-MM-DD', or as the screen's site writes it:
 * '09/13/1973' month first by default), digits of a phone number or an e-mail.
 */
function whereSearch<T extends Knex.QueryBuilder>(query: T, text: string, dateOrder: DateOrder = 'month-day-year'): T {
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
  return query
}

export async function searchPatients(db: Db, text: string, limit: number, dateOrder: DateOrder = 'month-day-year'): Promise<PatientDto[]> {
  const query = db<PatientRow>('patients').whereNull('merged_into_id').orderBy(['last_name', 'first_name', 'id']).limit(limit)
  return (await whereSearch(query, text, dateOrder)).map(toPatientDto)
}

/** Every record (merged-away ones left out), or those a search finds, for the export. */
export async function allPatientRecords(db: Db, text?: string): Promise<PatientRecordDto[]> {
  const query = db<PatientRecordRow>('patients').whereNull('merged_into_id').orderBy(['last_name', 'first_name', 'id'])
  return (await (text ? whereSearch(query, text) : query)).map(toPatientRecordDto)
}

export async function insertPatient(db: Db, columns: Record<string, unknown>): Promise<number> {
  const [id] = await db('patients').insert(columns)
  return id as number
}

/** Sets the given columns (an import's merge fills a record's empty fields) and counts a new version. */
export async function fillPatientBlanks(db: Db, id: number, columns: Record<string, unknown>): Promise<void> {
  await db('patients').where({ id }).update({ ...columns, row_version: db.raw('row_version + 1'), updated_at: db.fn.now(3) })
}
