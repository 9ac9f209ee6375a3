// GET /api/outbox?siteId=&state=&visitId=&patient=&beforeId=&limit=: patient e-mails of the caller's
// sites, newest first, at most OUTBOX_PAGE_MAX at a time; `beforeId` (the last id seen) pages on.
import { OutboxQuerySchema } from '#shared/schemas/outbox'
import type { OutboxMessageDto } from '#shared/types/outbox'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { listMessages } from '../../services/outbox-service'

export default defineEventHandler(async (event): Promise<OutboxMessageDto[]> => {
  const user = requireRole(event, BOOKING_ROLES)
  const query = await getValidatedQuery(event, validateWith(OutboxQuerySchema))
  return listMessages(query, user)
})
