// DELETE /api/blocks/:id: remove a block (admins, managers of its site).
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { notFound, numericParam } from '../../utils/errors'
import { deleteBlock, findBlock } from '../../repositories/blocks'
import { writeAudit } from '../../repositories/audit-log'
import { inTransaction } from '../../utils/db-retry'

export default defineEventHandler(async (event): Promise<{ ok: true }> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  await inTransaction(async (trx) => {
    const block = await findBlock(trx, id)
    if (!block) throw notFound('No such block.')
    requireSiteAccess(user, block.siteId)
    await deleteBlock(trx, id)
    await writeAudit(trx, { userId: user.id, action: 'block_deleted', entity: 'block', entityId: id, before: block })
  })
  return { ok: true }
})
