// POST /api/operatories: a new room at a site (admins, and managers of that site).
import type { OperatorySummary } from '#shared/types/sites'
import { OperatorySchema } from '#shared/schemas/sites'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { createOperatory } from '../../services/site-service'

export default defineEventHandler(async (event): Promise<OperatorySummary> => {
  const user = requireRole(event, MANAGING_ROLES)
  const body = await readValidatedBody(event, validateWith(OperatorySchema))
  requireSiteAccess(user, body.siteId)
  const room = await createOperatory(body)
  setResponseStatus(event, 201)
  return room
})
