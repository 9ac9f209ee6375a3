// GET /api/outbox/:id: one message with its text, HTML and .ics (as sent, or a preview while queued).
import type { OutboxDetailDto } from '#shared/types/outbox'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { numericParam } from '../../utils/errors'
import { messageDetail } from '../../services/outbox-service'

export default defineEventHandler(async (event): Promise<OutboxDetailDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  return messageDetail(numericParam(event, 'id'), user)
})
