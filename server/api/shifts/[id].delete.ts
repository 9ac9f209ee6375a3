// DELETE /api/shifts/:id: remove a shift (admins, managers of its site).
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { notFound, numericParam } from '../../utils/errors'
import { deleteShift, findShift } from '../../repositories/shifts'
import { writeAudit } from '../../repositories/audit-log'
import { inTransaction } from '../../utils/db-retry'

export default defineEventHandler(async (event): Promise<{ ok: true }> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  await inTransaction(async (trx) => {
    const shift = await findShift(trx, id)
    if (!shift) throw notFound('No such shift.')
    requireSiteAccess(user, shift.siteId)
    await deleteShift(trx, id)
    await writeAudit(trx, { userId: user.id, action: 'shift_deleted', entity: 'shift', entityId: id, before: shift })
  })
  return { ok: true }
})
