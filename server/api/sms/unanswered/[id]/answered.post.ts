// POST /api/sms/unanswered/:id/answered: the front desk has dealt with this text (it leaves the list).
import type { SmsReplyDto } from '#shared/types/sms'
import { BOOKING_ROLES, requireRole } from '../../../../utils/auth'
import { numericParam } from '../../../../utils/errors'
import { markAnswered } from '../../../../services/sms/thread-service'

export default defineEventHandler(async (event): Promise<SmsReplyDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  return markAnswered(numericParam(event, 'id'), user)
})
