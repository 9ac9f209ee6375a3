// GET /api/visit/:token: the one visit a patient's signed e-mail link opens (no sign-in).
import type { PublicVisitDto } from '#shared/types/outbox'
import { publicVisit } from '../../services/visit-link-service'
import { tokenParam } from '../../utils/token-param'

export default defineEventHandler(async (event): Promise<PublicVisitDto> => {
  return publicVisit(tokenParam(event))
})
