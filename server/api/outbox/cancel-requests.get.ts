// GET /api/outbox/cancel-requests?siteId=: upcoming visits whose patient asked to cancel through the e-mail link.
import { z } from 'zod'
import { IdSchema } from '#shared/schemas/common'
import type { CancelRequestDto } from '#shared/types/outbox'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { cancelRequests } from '../../services/outbox-service'

const QuerySchema = z.object({ siteId: IdSchema.optional() })

export default defineEventHandler(async (event): Promise<CancelRequestDto[]> => {
  const user = requireRole(event, BOOKING_ROLES)
  const { siteId } = await getValidatedQuery(event, validateWith(QuerySchema))
  return cancelRequests(siteId, user)
})
