// POST /api/move-offer/:token/decline: the patient keeps the current time; the visit is untouched.
import type { PublicMoveOfferDto } from '#shared/types/move-offer'
import { declineMoveOffer } from '../../../services/move-offer-service'
import { offerTokenParam } from '../../../utils/token-param'

export default defineEventHandler(async (event): Promise<PublicMoveOfferDto> => {
  return declineMoveOffer(offerTokenParam(event))
})
