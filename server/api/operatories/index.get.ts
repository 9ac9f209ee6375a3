// GET /api/operatories?siteId=: the rooms of one site in the caller's scope.
import type { OperatorySummary } from '#shared/types/sites'
import { SiteQuerySchema } from '#shared/schemas/common'
import { requireSiteAccess, requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { validateWith } from '../../utils/errors'
import { listOperatories } from '../../repositories/operatories'

export default defineEventHandler(async (event): Promise<OperatorySummary[]> => {
  const user = requireUser(event)
  const { siteId } = await getValidatedQuery(event, validateWith(SiteQuerySchema))
  requireSiteAccess(user, siteId)
  return listOperatories(useDb(), siteId)
})
