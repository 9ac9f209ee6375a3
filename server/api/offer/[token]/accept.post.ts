// POST /api/offer/:token/accept: the patient takes the offered time (booked through the booking
// transaction); 409 when someone else took it first, 410 when the offer expired.
import type { PublicOfferDto } from '#shared/types/waitlist'
import { acceptOffer } from '../../../services/offer-service'
import { offerTokenParam } from '../../../utils/token-param'

export default defineEventHandler(async (event): Promise<PublicOfferDto> => {
  const token = offerTokenParam(event)
  const offer = await acceptOffer(token)
  setResponseStatus(event, 201)
  return offer
})
