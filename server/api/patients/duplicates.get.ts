// GET /api/patients/duplicates?firstName&lastName&dateOfBirth[&email][&phone][&exceptId]: likely
// duplicates of a person about to be registered (same e-mail, same phone, or birth date and a similar name).
import { DuplicateCheckSchema } from '#shared/schemas/patients'
import type { DuplicateCandidateDto } from '#shared/types/patients'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { checkDuplicates } from '../../services/patient-service'

export default defineEventHandler(async (event): Promise<DuplicateCandidateDto[]> => {
  requireRole(event, BOOKING_ROLES)
  const input = await getValidatedQuery(event, validateWith(DuplicateCheckSchema))
  return checkDuplicates(input)
})
