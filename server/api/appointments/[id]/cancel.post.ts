// POST /api/appointments/:id/cancel: cancel with a reason; the chair and provider are freed.
import { CancelSchema } from '#shared/schemas/appointments'
import type { AppointmentDto } from '#shared/types/appointments'
import { BOOKING_ROLES, requireRole } from '../../../utils/auth'
import { numericParam, validateWith } from '../../../utils/errors'
import { changeVisitState } from '../../../services/booking-service'

export default defineEventHandler(async (event): Promise<AppointmentDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const id = numericParam(event, 'id')
  const { reason, rowVersion } = await readValidatedBody(event, validateWith(CancelSchema))
  return changeVisitState(id, 'cancelled', user, reason, rowVersion)
})
