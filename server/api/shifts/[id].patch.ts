// PATCH /api/shifts/:id: change a shift; the merged shift is validated and clash-checked again.
import type { ShiftDto } from '#shared/types/rota-api'
import { ShiftPatchSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { changeShift } from '../../services/rota-service'

export default defineEventHandler(async (event): Promise<ShiftDto> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(ShiftPatchSchema))
  return changeShift(user, id, patch)
})
