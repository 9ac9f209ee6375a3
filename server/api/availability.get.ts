// GET /api/availability?siteId=&from=&to=: when each chair is open and each provider works at a
// site, blocks applied; every interval in UTC and on the site's wall clock.
import type { AvailabilityResponse } from '#shared/types/rota-api'
import { AvailabilityQuerySchema } from '#shared/schemas/rota'
import { requireSiteAccess, requireUser } from '../utils/auth'
import { validateWith } from '../utils/errors'
import { availabilityOf } from '../services/availability-service'

export default defineEventHandler(async (event): Promise<AvailabilityResponse> => {
  const user = requireUser(event)
  const query = await getValidatedQuery(event, validateWith(AvailabilityQuerySchema))
  requireSiteAccess(user, query.siteId)
  return availabilityOf(query)
})
