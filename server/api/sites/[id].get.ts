// GET /api/sites/:id: one site with its calendar, if it is in the caller's scope.
import type { SiteDetail } from '#shared/types/sites'
import { requireSiteAccess, requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { notFound, numericParam } from '../../utils/errors'
import { findSiteDetail } from '../../repositories/sites'

export default defineEventHandler(async (event): Promise<SiteDetail> => {
  const user = requireUser(event)
  const id = numericParam(event, 'id')
  requireSiteAccess(user, id)
  const site = await findSiteDetail(useDb(), id)
  if (!site) throw notFound('No such site.')
  return site
})
