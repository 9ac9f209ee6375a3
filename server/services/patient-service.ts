// Registering and opening patients. Records are group-wide; every opening is audited.
import type { SessionUser } from '#shared/types/auth'
import type { PatientDto } from '#shared/types/visits'
import type { NewPatientInput } from '#shared/schemas/visits'
import { requireSiteAccess } from '../utils/auth'
import { useDb } from '../utils/db'
import { inTransaction } from '../utils/db-retry'
import { badRequest, notFound } from '../utils/errors'
import { findPatient, insertPatient } from '../repositories/patients'
import { findSite } from '../repositories/sites'
import { writeAudit } from '../repositories/audit-log'

/** A preferred site must be one of the caller's (403) and exist (400). */
export function registerPatient(user: SessionUser, input: NewPatientInput): Promise<PatientDto> {
  if (input.preferredSiteId) requireSiteAccess(user, input.preferredSiteId)
  return inTransaction(async (trx) => {
    if (input.preferredSiteId && !(await findSite(trx, input.preferredSiteId))) throw badRequest('preferredSiteId', 'is not a site')
    const id = await insertPatient(trx, {
      firstName: input.firstName, lastName: input.lastName, dateOfBirth: input.dateOfBirth, email: input.email ?? null,
      phone: input.phone ?? null, preferredSiteId: input.preferredSiteId ?? null, emailConsent: input.emailConsent,
    })
    return (await findPatient(trx, id))!
  })
}

/** One patient, with an audit row saying who opened the record and from where. */
export async function openPatient(user: SessionUser, id: number, ip: string): Promise<PatientDto> {
  const db = useDb()
  const patient = await findPatient(db, id)
  if (!patient) throw notFound('No such patient.')
  await writeAudit(db, { userId: user.id, action: 'patient_opened', entity: 'patient', entityId: patient.id, ip })
  return patient
}
