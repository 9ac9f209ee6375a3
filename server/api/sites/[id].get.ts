// GET /api/sites/:id: one site, if it is in the caller's scope.
import type { SiteSummary } from '#shared/types/auth'
import { requireSiteAccess, requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { notFound, numericParam } from '../../utils/errors'
import { findSite } from '../../repositories/sites'

export default defineEventHandler(async (event): Promise<SiteSummary> => {
  const user = requireUser(event)
  const id = numericParam(event, 'id')
  requireSiteAccess(user, id)
  const site = await findSite(useDb(), id)
  if (!site) throw notFound('No such site.')
  return site
})
