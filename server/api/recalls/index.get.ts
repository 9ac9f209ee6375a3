// GET /api/recalls?siteId=&to=&kind=: the site's patients due or overdue for a cleaning or exam, not yet booked.
import type { RecallDto } from '#shared/types/recall'
import { RecallListQuerySchema } from '#shared/schemas/recall'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { listRecalls } from '../../services/recall-service'

export default defineEventHandler(async (event): Promise<RecallDto[]> => {
  const user = requireRole(event, BOOKING_ROLES)
  const query = await getValidatedQuery(event, validateWith(RecallListQuerySchema))
  return listRecalls(query, user)
})
