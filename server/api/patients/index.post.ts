// POST /api/patients: register a patient (front desk, managers, admins).
import { DateTime } from 'luxon'
import { NewPatientSchema } from '#shared/schemas/visits'
import type { PatientDto } from '#shared/types/visits'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { badRequest, validateWith } from '../../utils/errors'
import { registerPatient } from '../../services/patient-service'

export default defineEventHandler(async (event): Promise<PatientDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const input = await readValidatedBody(event, validateWith(NewPatientSchema))
  const born = DateTime.fromISO(input.dateOfBirth, { zone: 'UTC' })
  if (!born.isValid) throw badRequest('dateOfBirth', 'is not a real date')
  if (born > DateTime.utc()) throw badRequest('dateOfBirth', 'cannot be in the future')
  const patient = await registerPatient(user, input)
  setResponseStatus(event, 201)
  return patient
})
