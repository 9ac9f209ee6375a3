// POST /api/visits/:id/cancel: cancel with a reason; the chair and provider are freed.
import { CancelSchema } from '#shared/schemas/visits'
import type { VisitDto } from '#shared/types/visits'
import { BOOKING_ROLES, requireRole } from '../../../utils/auth'
import { numericParam, validateWith } from '../../../utils/errors'
import { changeVisitState } from '../../../services/booking-service'

export default defineEventHandler(async (event): Promise<VisitDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const id = numericParam(event, 'id')
  const { reason, rowVersion } = await readValidatedBody(event, validateWith(CancelSchema))
  return changeVisitState(id, 'cancelled', user, reason, rowVersion)
})
