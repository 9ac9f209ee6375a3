// POST /api/patient-merges: merge one patient record into another (managers and admins), field by
// field; 409 naming the visits when the two have visits at the same time.
import { PatientMergeSchema } from '#shared/schemas/patients'
import type { PatientMergeResult } from '#shared/types/patients'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { clientIp } from '../../utils/client-ip'
import { mergePatients } from '../../services/patient-service'

export default defineEventHandler(async (event): Promise<PatientMergeResult> => {
  const user = requireRole(event, MANAGING_ROLES)
  const input = await readValidatedBody(event, validateWith(PatientMergeSchema))
  const result = await mergePatients(user, input, clientIp(event))
  setResponseStatus(event, 201)
  return result
})
