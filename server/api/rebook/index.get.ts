// GET /api/rebook?siteId=: the site's Rebook list (issue 13 §2): open visits stranded by a change,
// earliest first, with the patient's phone and the reason; the navigation shows its count.
import type { RebookList } from '#shared/types/rebook'
import { RebookQuerySchema } from '#shared/schemas/impact'
import { BOOKING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { validateWith } from '../../utils/errors'
import { listRebook } from '../../repositories/stranded'

export default defineEventHandler(async (event): Promise<RebookList> => {
  const user = requireRole(event, BOOKING_ROLES)
  const { siteId } = await getValidatedQuery(event, validateWith(RebookQuerySchema))
  requireSiteAccess(user, siteId)
  const visits = await listRebook(useDb(), [siteId])
  return { siteId, count: visits.length, visits }
})
