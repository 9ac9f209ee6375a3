// GET /api/waitlist?siteId=&state=: the site's waitlist (issue 17 §2), first priority then longest waiting.
import type { WaitlistEntryDto } from '#shared/types/waitlist'
import { WaitlistListQuerySchema } from '#shared/schemas/waitlist'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { listWaitlist } from '../../services/waitlist-service'

export default defineEventHandler(async (event): Promise<WaitlistEntryDto[]> => {
  const user = requireRole(event, BOOKING_ROLES)
  const { siteId, state } = await getValidatedQuery(event, validateWith(WaitlistListQuerySchema))
  return listWaitlist(siteId, state, user)
})
