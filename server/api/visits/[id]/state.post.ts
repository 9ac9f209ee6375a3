// POST /api/visits/:id/state: move a visit along its states. Who may, and when, is decided by
// shared/domain/visit-access.ts in the booking service (403 for who, 409 in words for the state or time).
import { ChangeStateSchema } from '#shared/schemas/visits'
import type { VisitDto } from '#shared/types/visits'
import { STAFF_ROLES, requireRole } from '../../../utils/auth'
import { badRequest, numericParam, validateWith } from '../../../utils/errors'
import { changeVisitState } from '../../../services/booking-service'

export default defineEventHandler(async (event): Promise<VisitDto> => {
  const user = requireRole(event, STAFF_ROLES)
  const id = numericParam(event, 'id')
  const { state, rowVersion } = await readValidatedBody(event, validateWith(ChangeStateSchema))
  if (state === 'cancelled') throw badRequest('state', 'use POST /api/visits/:id/cancel with a reason')
  return changeVisitState(id, state, user, undefined, rowVersion)
})
