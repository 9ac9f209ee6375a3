// POST /api/patients: register a patient (front desk, managers, admins).
import { DateTime } from 'luxon'
import { NewPatientSchema } from '#shared/schemas/appointments'
import type { PatientDto } from '#shared/types/appointments'
import { BOOKING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { badRequest, validateWith } from '../../utils/errors'
import { findPatient, insertPatient } from '../../repositories/patients'
import { findSite } from '../../repositories/sites'

export default defineEventHandler(async (event): Promise<PatientDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const input = await readValidatedBody(event, validateWith(NewPatientSchema))
  const born = DateTime.fromISO(input.dateOfBirth, { zone: 'UTC' })
  if (!born.isValid) throw badRequest('dateOfBirth', 'is not a real date')
  if (born > DateTime.utc()) throw badRequest('dateOfBirth', 'cannot be in the future')
  if (input.preferredSiteId) requireSiteAccess(user, input.preferredSiteId)
  const db = useDb()
  if (input.preferredSiteId && !(await findSite(db, input.preferredSiteId))) throw badRequest('preferredSiteId', 'is not a site')
  const id = await insertPatient(db, {
    firstName: input.firstName, lastName: input.lastName, dateOfBirth: input.dateOfBirth, email: input.email ?? null,
    phone: input.phone ?? null, preferredSiteId: input.preferredSiteId ?? null, emailConsent: input.emailConsent,
  })
  setResponseStatus(event, 201)
  return (await findPatient(db, id))!
})
