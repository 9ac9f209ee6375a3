// GET /api/recall-times/:token: the recall page behind a recall e-mail (no sign-in; the signed token is
// the key): up to 6 times for the recall's plan at the patient's preferred site.
import type { PublicRecallDto } from '#shared/types/recall-page'
import { publicRecall } from '../../services/recall-page-service'
import { recallTokenParam } from '../../utils/token-param'

export default defineEventHandler(async (event): Promise<PublicRecallDto> => {
  return publicRecall(recallTokenParam(event))
})
