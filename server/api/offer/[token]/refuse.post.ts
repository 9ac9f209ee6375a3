// POST /api/offer/:token/refuse: the patient says no to this time; they stay on the waitlist.
import type { PublicOfferDto } from '#shared/types/waitlist'
import { refuseOffer } from '../../../services/offer-service'
import { offerTokenParam } from '../../../utils/token-param'

export default defineEventHandler(async (event): Promise<PublicOfferDto> => {
  return refuseOffer(offerTokenParam(event))
})
