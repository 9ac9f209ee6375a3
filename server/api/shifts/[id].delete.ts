// DELETE /api/shifts/:id: remove a shift (admins, managers of its site).
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { notFound, numericParam } from '../../utils/errors'
import { deleteShift, findShift } from '../../repositories/shifts'
import { writeAudit } from '../../repositories/audit-log'

export default defineEventHandler(async (event): Promise<{ ok: true }> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  await useDb().transaction(async (trx) => {
    const shift = await findShift(trx, id)
    if (!shift) throw notFound('No such shift.')
    requireSiteAccess(user, shift.siteId)
    await deleteShift(trx, id)
    await writeAudit(trx, { userId: user.id, action: 'shift_deleted', entity: 'shift', entityId: id, before: shift })
  })
  return { ok: true }
})
