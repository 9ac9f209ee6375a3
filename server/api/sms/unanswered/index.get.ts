// GET /api/sms/unanswered?siteId=: patients' texts no keyword answered, for the front desk, newest first.
import { UnansweredQuerySchema } from '#shared/schemas/sms'
import type { SmsReplyDto } from '#shared/types/sms'
import { BOOKING_ROLES, requireRole } from '../../../utils/auth'
import { validateWith } from '../../../utils/errors'
import { unansweredReplies } from '../../../services/sms/thread-service'

export default defineEventHandler(async (event): Promise<SmsReplyDto[]> => {
  const user = requireRole(event, BOOKING_ROLES)
  const query = await getValidatedQuery(event, validateWith(UnansweredQuerySchema))
  return unansweredReplies(query.siteId, user)
})
