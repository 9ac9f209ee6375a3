// GET /api/patients/:id: one patient (the Chairboard's "open patient").
import type { PatientDto } from '#shared/types/appointments'
import { STAFF_ROLES, requireRole } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { notFound, numericParam } from '../../utils/errors'
import { findPatient } from '../../repositories/patients'

export default defineEventHandler(async (event): Promise<PatientDto> => {
  requireRole(event, STAFF_ROLES)
  const patient = await findPatient(useDb(), numericParam(event, 'id'))
  if (!patient) throw notFound('No such patient.')
  return patient
})
