// POST /api/outbox/:id/resend: queue a fresh copy of a sent, failed or skipped message (checked again at send time).
import type { OutboxMessageDto } from '#shared/types/outbox'
import { BOOKING_ROLES, requireRole } from '../../../utils/auth'
import { numericParam } from '../../../utils/errors'
import { resendMessage } from '../../../services/outbox-service'

export default defineEventHandler(async (event): Promise<OutboxMessageDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const message = await resendMessage(numericParam(event, 'id'), user)
  setResponseStatus(event, 201)
  return message
})
