// POST /api/move-offer/:token/accept: the patient moves the visit to the proposed time (the booking
// service's move); 409 when the time is no longer free (the visit stays), 410 when the offer expired.
import type { PublicMoveOfferDto } from '#shared/types/move-offer'
import { acceptMoveOffer } from '../../../services/move-offer-service'
import { offerTokenParam } from '../../../utils/token-param'

export default defineEventHandler(async (event): Promise<PublicMoveOfferDto> => {
  return acceptMoveOffer(offerTokenParam(event))
})
