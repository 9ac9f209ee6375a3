// POST /api/visits/:id/move-offers: e-mail the patient an offer to move the visit to the proposed time
// (Balance's "consolidate" suggestion). Nothing moves until the patient accepts on the linked page.
import type { SentMoveOfferDto } from '#shared/types/move-offer'
import { SendMoveOfferSchema } from '#shared/schemas/move-offer'
import { BOOKING_ROLES, requireRole } from '../../../utils/auth'
import { numericParam, validateWith } from '../../../utils/errors'
import { sendMoveOffer } from '../../../services/move-offer-service'

export default defineEventHandler(async (event): Promise<SentMoveOfferDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const id = numericParam(event, 'id')
  const input = await readValidatedBody(event, validateWith(SendMoveOfferSchema))
  const sent = await sendMoveOffer(id, input, user)
  setResponseStatus(event, 201)
  return sent
})
