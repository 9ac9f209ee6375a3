// PATCH /api/operatories/:id: rename a room, change its capabilities, order or active flag.
import type { OperatorySummary } from '#shared/types/sites'
import { OperatoryPatchSchema } from '#shared/schemas/sites'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { inTransaction } from '../../utils/db-retry'
import { conflict, isDuplicateKey, notFound, numericParam, validateWith } from '../../utils/errors'
import { findOperatory, updateOperatory } from '../../repositories/operatories'

export default defineEventHandler(async (event): Promise<OperatorySummary> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(OperatoryPatchSchema))
  // In the retrying transaction helper, like a booking: a lock wait is retried, then answered 503.
  return inTransaction(async (db) => {
    const room = await findOperatory(db, id)
    if (!room) throw notFound('No such room.')
    requireSiteAccess(user, room.siteId)
    await updateOperatory(db, id, patch).catch((error: unknown) => {
      if (isDuplicateKey(error)) throw conflict(`This site already has a room called "${patch.name}".`, { field: 'name' })
      throw error
    })
    return (await findOperatory(db, id))!
  })
})
