// PATCH /api/visits/:id: move (time, chair, provider) or re-plan, with the row version seen.
import { MoveVisitSchema } from '#shared/schemas/visits'
import type { VisitDto } from '#shared/types/visits'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { moveVisit } from '../../services/booking-service'

export default defineEventHandler(async (event): Promise<VisitDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const id = numericParam(event, 'id')
  const input = await readValidatedBody(event, validateWith(MoveVisitSchema))
  return moveVisit(id, input, user)
})
