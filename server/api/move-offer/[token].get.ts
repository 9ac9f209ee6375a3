// GET /api/move-offer/:token: the visit's current time and the time proposed (no sign-in; the signed token is the key).
import type { PublicMoveOfferDto } from '#shared/types/move-offer'
import { publicMoveOffer } from '../../services/move-offer-service'
import { offerTokenParam } from '../../utils/token-param'

export default defineEventHandler(async (event): Promise<PublicMoveOfferDto> => {
  return publicMoveOffer(offerTokenParam(event))
})
