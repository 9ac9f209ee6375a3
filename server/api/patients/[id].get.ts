// GET /api/patients/:id: one patient's whole record. Patient records are group-wide (a patient may be
// seen at any site), so every opening is written to the audit log. A record merged into another answers
// 308 with the survivor's address and `{ mergedInto }`.
import type { MergedPatientAnswer, PatientRecordDto } from '#shared/types/patients'
import { STAFF_ROLES, requireRole } from '../../utils/auth'
import { numericParam } from '../../utils/errors'
import { clientIp } from '../../utils/client-ip'
import { openPatient } from '../../services/patient-service'

export default defineEventHandler(async (event): Promise<PatientRecordDto | MergedPatientAnswer> => {
  const user = requireRole(event, STAFF_ROLES)
  const answer = await openPatient(user, numericParam(event, 'id'), clientIp(event))
  if ('mergedInto' in answer) {
    setResponseStatus(event, 308)
    setResponseHeader(event, 'location', `/api/patients/${answer.mergedInto}`)
  }
  return answer
})
