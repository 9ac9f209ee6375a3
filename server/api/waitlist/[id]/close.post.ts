// POST /api/waitlist/:id/close: take an entry off the waitlist (optional reason).
import type { WaitlistEntryDto } from '#shared/types/waitlist'
import { CloseWaitlistEntrySchema } from '#shared/schemas/waitlist'
import { BOOKING_ROLES, requireRole } from '../../../utils/auth'
import { numericParam, validateWith } from '../../../utils/errors'
import { closeWaitlistEntry } from '../../../services/waitlist-service'

export default defineEventHandler(async (event): Promise<WaitlistEntryDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const id = numericParam(event, 'id')
  const { reason } = await readValidatedBody(event, validateWith(CloseWaitlistEntrySchema))
  return closeWaitlistEntry(id, reason, user)
})
