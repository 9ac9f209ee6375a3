// POST /api/visit/:token/confirm: the patient confirms (booked → confirmed). Same answer when already confirmed.
import type { PublicVisitDto } from '#shared/types/outbox'
import { confirmByPatient } from '../../../services/visit-link-service'
import { tokenParam } from '../../../utils/token-param'

export default defineEventHandler(async (event): Promise<PublicVisitDto> => {
  return confirmByPatient(tokenParam(event))
})
