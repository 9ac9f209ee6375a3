// POST /api/operatories: a new room at a site (admins, and managers of that site).
import type { OperatorySummary } from '#shared/types/sites'
import { OperatorySchema } from '#shared/schemas/sites'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { inTransaction } from '../../utils/db-retry'
import { badRequest, conflict, isDuplicateKey, validateWith } from '../../utils/errors'
import { findOperatory, insertOperatory } from '../../repositories/operatories'
import { findSite } from '../../repositories/sites'

export default defineEventHandler(async (event): Promise<OperatorySummary> => {
  const user = requireRole(event, MANAGING_ROLES)
  const body = await readValidatedBody(event, validateWith(OperatorySchema))
  requireSiteAccess(user, body.siteId)
  // In the retrying transaction helper, like a booking: a lock wait is retried, then answered 503.
  return inTransaction(async (db) => {
    if (!(await findSite(db, body.siteId))) throw badRequest('siteId', 'is not a site')
    const id = await insertOperatory(db, body).catch((error: unknown) => {
      if (isDuplicateKey(error)) throw conflict(`This site already has a room called "${body.name}".`, { field: 'name' })
      throw error
    })
    setResponseStatus(event, 201)
    return (await findOperatory(db, id))!
  })
})
