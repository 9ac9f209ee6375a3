// GET /api/balance/suggestions?from=&to=[&siteId=][&quietBelow=&tightFrom=]: what Balance suggests over
// the same range as the figures (waitlist and recall fits for quiet chairs, rota moves, visits that
// could move to join short free stretches), a few of each kind, for managers and admins.
import type { BalanceSuggestionsResponse } from '#shared/types/balance'
import { BalanceQuerySchema } from '#shared/schemas/balance'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { balanceSuggestions } from '../../services/balance-suggestion-service'

export default defineEventHandler(async (event): Promise<BalanceSuggestionsResponse> => {
  const user = requireRole(event, MANAGING_ROLES)
  const query = await getValidatedQuery(event, validateWith(BalanceQuerySchema))
  return balanceSuggestions(user, query)
})
