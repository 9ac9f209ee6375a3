// POST /api/patients: register a patient (front desk, managers, admins). The screens ask
// GET /api/patients/duplicates first and warn; this route registers what it is sent.
import { NewPatientSchema } from '#shared/schemas/visits'
import type { PatientRecordDto } from '#shared/types/patients'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { clientIp } from '../../utils/client-ip'
import { registerPatient } from '../../services/patient-service'

export default defineEventHandler(async (event): Promise<PatientRecordDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const input = await readValidatedBody(event, validateWith(NewPatientSchema))
  const patient = await registerPatient(user, input, clientIp(event))
  setResponseStatus(event, 201)
  return patient
})
