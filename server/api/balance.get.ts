// GET /api/balance?from=&to=[&siteId=][&quietBelow=&tightFrom=]: how full each chair and provider
// is over local dates from..to (inclusive, at most 31 days), for managers and admins.
import type { BalanceResponse } from '#shared/types/balance'
import { BalanceQuerySchema } from '#shared/schemas/balance'
import { MANAGING_ROLES, requireRole } from '../utils/auth'
import { validateWith } from '../utils/errors'
import { balanceAcrossSites } from '../services/balance-service'

export default defineEventHandler(async (event): Promise<BalanceResponse> => {
  const user = requireRole(event, MANAGING_ROLES)
  const query = await getValidatedQuery(event, validateWith(BalanceQuerySchema))
  return balanceAcrossSites(user, query)
})
