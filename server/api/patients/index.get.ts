// GET /api/patients?q=[&dateOrder=]: find patients by name, birth date (ISO or in the given date order), phone digits or e-mail.
import { PatientSearchSchema } from '#shared/schemas/visits'
import type { PatientDto } from '#shared/types/visits'
import { STAFF_ROLES, requireRole } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { validateWith } from '../../utils/errors'
import { searchPatients } from '../../repositories/patients'

export default defineEventHandler(async (event): Promise<PatientDto[]> => {
  requireRole(event, STAFF_ROLES)
  const { q, limit, dateOrder } = await getValidatedQuery(event, validateWith(PatientSearchSchema))
  return searchPatients(useDb(), q, limit, dateOrder)
})
