// POST /api/waitlist/offers: e-mail offers of a freed gap to chosen waitlist entries; the first to accept gets it.
import type { SentOffersDto } from '#shared/types/waitlist'
import { SendOffersSchema } from '#shared/schemas/waitlist'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { sendOffers } from '../../services/offer-service'

export default defineEventHandler(async (event): Promise<SentOffersDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const input = await readValidatedBody(event, validateWith(SendOffersSchema))
  return sendOffers(input, user)
})
