// DELETE /api/shift-exceptions/:id: withdraw time off or an extra day.
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam } from '../../utils/errors'
import { deleteShiftException } from '../../services/rota-service'

export default defineEventHandler(async (event): Promise<{ ok: true }> => {
  const user = requireRole(event, MANAGING_ROLES)
  await deleteShiftException(user, numericParam(event, 'id'))
  return { ok: true }
})
