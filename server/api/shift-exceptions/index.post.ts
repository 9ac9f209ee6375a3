// POST /api/shift-exceptions: time off (a date range) or an extra one-off shift.
import type { ShiftExceptionDto } from '#shared/types/rota-api'
import { ShiftExceptionSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { createShiftException } from '../../services/rota-service'

export default defineEventHandler(async (event): Promise<ShiftExceptionDto> => {
  const user = requireRole(event, MANAGING_ROLES)
  const body = await readValidatedBody(event, validateWith(ShiftExceptionSchema))
  const saved = await createShiftException(user, body)
  setResponseStatus(event, 201)
  return saved
})
