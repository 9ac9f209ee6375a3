// GET /api/patients/:id: one patient (the Chairboard's "open patient"). Patient records are
// group-wide (a patient may be seen at any site), so every opening is written to the audit log.
import type { PatientDto } from '#shared/types/appointments'
import { STAFF_ROLES, requireRole } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { notFound, numericParam } from '../../utils/errors'
import { clientIp } from '../../utils/client-ip'
import { findPatient } from '../../repositories/patients'
import { writeAudit } from '../../repositories/audit-log'

export default defineEventHandler(async (event): Promise<PatientDto> => {
  const user = requireRole(event, STAFF_ROLES)
  const db = useDb()
  const patient = await findPatient(db, numericParam(event, 'id'))
  if (!patient) throw notFound('No such patient.')
  await writeAudit(db, { userId: user.id, action: 'patient_opened', entity: 'patient', entityId: patient.id, ip: clientIp(event) })
  return patient
})
