// GET /api/patients/:id/visits: every visit of the patient, past and future, cancelled ones included,
// at the sites the caller may see (the patient page's history).
import type { BoardVisitDto } from '#shared/types/visits'
import { STAFF_ROLES, requireRole } from '../../../utils/auth'
import { numericParam } from '../../../utils/errors'
import { patientHistory } from '../../../services/visit-list-service'

export default defineEventHandler(async (event): Promise<BoardVisitDto[]> => {
  const user = requireRole(event, STAFF_ROLES)
  return patientHistory(numericParam(event, 'id'), user)
})
