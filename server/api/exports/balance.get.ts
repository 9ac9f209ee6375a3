// GET /api/exports/balance?from&to[&siteId][&quietBelow&tightFrom]: the Balance figures as CSV, a row
// per site and day and one per site for the whole range (managers and admins; at most 31 days).
import { BalanceQuerySchema } from '#shared/schemas/balance'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { exportBalance } from '../../services/export-service'

export default defineEventHandler(async (event): Promise<string> => {
  const user = requireRole(event, MANAGING_ROLES)
  const query = await getValidatedQuery(event, validateWith(BalanceQuerySchema))
  const csv = await exportBalance(user, query)
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="balance-${query.from}-${query.to}.csv"`)
  return csv
})
