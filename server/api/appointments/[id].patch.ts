// PATCH /api/appointments/:id: move (time, chair, provider) or re-plan, with the row version seen.
import { MoveAppointmentSchema } from '#shared/schemas/appointments'
import type { AppointmentDto } from '#shared/types/appointments'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { moveAppointment } from '../../services/booking-service'

export default defineEventHandler(async (event): Promise<AppointmentDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const id = numericParam(event, 'id')
  const input = await readValidatedBody(event, validateWith(MoveAppointmentSchema))
  return moveAppointment(id, input, user)
})
