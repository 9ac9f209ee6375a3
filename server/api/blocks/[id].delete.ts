// DELETE /api/blocks/:id: remove a block (admins, managers of its site).
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam } from '../../utils/errors'
import { deleteBlock } from '../../services/rota-service'

export default defineEventHandler(async (event): Promise<{ ok: true }> => {
  const user = requireRole(event, MANAGING_ROLES)
  await deleteBlock(user, numericParam(event, 'id'))
  return { ok: true }
})
