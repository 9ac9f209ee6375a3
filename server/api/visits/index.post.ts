// POST /api/visits: book a visit. Header Idempotency-Key makes a retry safe.
import { BookVisitSchema } from '#shared/schemas/visits'
import type { VisitDto } from '#shared/types/visits'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { badRequest, validateWith } from '../../utils/errors'
import { bookVisit } from '../../services/booking-service'


export default defineEventHandler(async (event): Promise<VisitDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const input = await readValidatedBody(event, validateWith(BookVisitSchema))
  const key = getRequestHeader(event, 'idempotency-key')?.trim()
  if (key !== undefined && (key.length < 8 || key.length > 100)) throw badRequest('Idempotency-Key', 'must be 8 to 100 characters')
  setResponseStatus(event, 201)
  return bookVisit(input, user, key || undefined)
})
