// POST /api/visit/:token/cancel: the patient asks to cancel; by the site's policy the front desk
// decides (default) or the visit is cancelled at once.
import type { PublicVisitDto } from '#shared/types/outbox'
import { requestCancelByPatient } from '../../../services/visit-link-service'
import { tokenParam } from '../../../utils/token-param'

export default defineEventHandler(async (event): Promise<PublicVisitDto> => {
  return requestCancelByPatient(tokenParam(event))
})
