// DELETE /api/shifts/:id: remove a shift (admins, managers of its site).
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam } from '../../utils/errors'
import { deleteShift } from '../../services/rota-service'

export default defineEventHandler(async (event): Promise<{ ok: true }> => {
  const user = requireRole(event, MANAGING_ROLES)
  await deleteShift(user, numericParam(event, 'id'))
  return { ok: true }
})
