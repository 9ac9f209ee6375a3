// PATCH /api/operatories/:id: rename a room, change its capabilities, order or active flag.
import type { OperatorySummary } from '#shared/types/sites'
import { OperatoryPatchSchema } from '#shared/schemas/sites'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { changeOperatory } from '../../services/site-service'

export default defineEventHandler(async (event): Promise<OperatorySummary> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(OperatoryPatchSchema))
  return changeOperatory(user, id, patch)
})
