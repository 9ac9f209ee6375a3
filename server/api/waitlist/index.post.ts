// POST /api/waitlist: put a patient on the waitlist with a visit plan, sites, dates, part of day, notice, priority.
import type { WaitlistEntryDto } from '#shared/types/waitlist'
import { NewWaitlistEntrySchema } from '#shared/schemas/waitlist'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { addWaitlistEntry } from '../../services/waitlist-service'

export default defineEventHandler(async (event): Promise<WaitlistEntryDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const input = await readValidatedBody(event, validateWith(NewWaitlistEntrySchema))
  setResponseStatus(event, 201)
  return addWaitlistEntry(input, user)
})
