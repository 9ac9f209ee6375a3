// POST /api/appointments: book a visit. Header Idempotency-Key makes a retry safe.
import { BookAppointmentSchema } from '#shared/schemas/appointments'
import type { AppointmentDto } from '#shared/types/appointments'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { badRequest, validateWith } from '../../utils/errors'
import { bookAppointment } from '../../services/booking-service'


export default defineEventHandler(async (event): Promise<AppointmentDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const input = await readValidatedBody(event, validateWith(BookAppointmentSchema))
  const key = getRequestHeader(event, 'idempotency-key')?.trim()
  if (key !== undefined && (key.length < 8 || key.length > 100)) throw badRequest('Idempotency-Key', 'must be 8 to 100 characters')
  setResponseStatus(event, 201)
  return bookAppointment(input, user, key || undefined)
})
