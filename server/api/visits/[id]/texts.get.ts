// GET /api/visits/:id/texts: the visit's text thread (texts sent, replies) and whether the patient can be texted.
import type { TextThreadDto } from '#shared/types/sms'
import { BOOKING_ROLES, requireRole } from '../../../utils/auth'
import { numericParam } from '../../../utils/errors'
import { textThread } from '../../../services/sms/thread-service'

export default defineEventHandler(async (event): Promise<TextThreadDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  return textThread(numericParam(event, 'id'), user)
})
