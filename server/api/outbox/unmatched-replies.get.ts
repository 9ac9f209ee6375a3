// GET /api/outbox/unmatched-replies?siteId=: calendar replies that matched no visit (kept, not dropped).
import { z } from 'zod'
import { IdSchema } from '#shared/schemas/common'
import type { UnmatchedReplyDto } from '#shared/types/outbox'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { unmatchedReplies } from '../../services/inbound-service'

const QuerySchema = z.object({ siteId: IdSchema.optional() })

export default defineEventHandler(async (event): Promise<UnmatchedReplyDto[]> => {
  const user = requireRole(event, BOOKING_ROLES)
  const { siteId } = await getValidatedQuery(event, validateWith(QuerySchema))
  return unmatchedReplies(siteId, user)
})
