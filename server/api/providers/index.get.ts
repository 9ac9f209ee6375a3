// GET /api/providers?siteId=: dentists and hygienists working at a site (all in scope without siteId).
import type { ProviderSummary } from '#shared/types/people'
import { ProviderQuerySchema } from '#shared/schemas/people'
import { canAccessSite, requireSiteAccess, requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { validateWith } from '../../utils/errors'
import { listProviders } from '../../repositories/providers'

export default defineEventHandler(async (event): Promise<ProviderSummary[]> => {
  const user = requireUser(event)
  const { siteId } = await getValidatedQuery(event, validateWith(ProviderQuerySchema))
  if (siteId !== undefined) requireSiteAccess(user, siteId)
  const providers = await listProviders(useDb(), siteId ?? null)
  return siteId !== undefined ? providers : providers.filter((p) => p.siteIds.some((id) => canAccessSite(user, id)))
})
