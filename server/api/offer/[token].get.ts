// GET /api/offer/:token: the one time a waitlist offer e-mail offers (no sign-in; the signed token is the key).
import type { PublicOfferDto } from '#shared/types/waitlist'
import { publicOffer } from '../../services/offer-service'
import { offerTokenParam } from '../../utils/token-param'

export default defineEventHandler(async (event): Promise<PublicOfferDto> => {
  return publicOffer(offerTokenParam(event))
})
