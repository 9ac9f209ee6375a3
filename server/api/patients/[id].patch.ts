// PATCH /api/patients/:id: save the whole record as edited on `rowVersion` (stale → 409).
import { PatientEditSchema } from '#shared/schemas/patients'
import type { PatientRecordDto } from '#shared/types/patients'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { clientIp } from '../../utils/client-ip'
import { editPatient } from '../../services/patient-service'

export default defineEventHandler(async (event): Promise<PatientRecordDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const id = numericParam(event, 'id')
  const input = await readValidatedBody(event, validateWith(PatientEditSchema))
  return editPatient(user, id, input, clientIp(event))
})
