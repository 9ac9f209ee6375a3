// GET /api/waitlist/matches?visitId= | ?siteId&operatoryId&startUtc&endUtc: waitlist entries that fit a freed gap, ranked.
import type { WaitlistMatchesDto } from '#shared/types/waitlist'
import { WaitlistGapQuerySchema } from '#shared/schemas/waitlist'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { waitlistMatches } from '../../services/waitlist-service'

export default defineEventHandler(async (event): Promise<WaitlistMatchesDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const query = await getValidatedQuery(event, validateWith(WaitlistGapQuerySchema))
  return waitlistMatches(query, user)
})
