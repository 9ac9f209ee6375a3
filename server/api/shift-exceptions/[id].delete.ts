// DELETE /api/shift-exceptions/:id: withdraw time off or an extra day.
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { notFound, numericParam } from '../../utils/errors'
import { deleteShiftException, findShiftException } from '../../repositories/shift-exceptions'
import { findProvider } from '../../repositories/providers'
import { writeAudit } from '../../repositories/audit-log'
import { inTransaction } from '../../utils/db-retry'

export default defineEventHandler(async (event): Promise<{ ok: true }> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  await inTransaction(async (trx) => {
    const exception = await findShiftException(trx, id)
    if (!exception) throw notFound('No such exception.')
    const siteIds = exception.siteId !== null ? [exception.siteId] : (await findProvider(trx, exception.providerId))?.siteIds ?? []
    for (const siteId of siteIds) requireSiteAccess(user, siteId)
    await deleteShiftException(trx, id)
    await writeAudit(trx, { userId: user.id, action: 'shift_exception_deleted', entity: 'shift_exception', entityId: id, before: exception })
  })
  return { ok: true }
})
