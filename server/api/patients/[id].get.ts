// GET /api/patients/:id: one patient (the Chairboard's "open patient"). Patient records are
// group-wide (a patient may be seen at any site), so every opening is written to the audit log.
import type { PatientDto } from '#shared/types/visits'
import { STAFF_ROLES, requireRole } from '../../utils/auth'
import { numericParam } from '../../utils/errors'
import { clientIp } from '../../utils/client-ip'
import { openPatient } from '../../services/patient-service'

export default defineEventHandler(async (event): Promise<PatientDto> => {
  const user = requireRole(event, STAFF_ROLES)
  return openPatient(user, numericParam(event, 'id'), clientIp(event))
})
