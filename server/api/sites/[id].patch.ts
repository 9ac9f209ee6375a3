// PATCH /api/sites/:id: change a site's details, calendar or active flag (admins only).
import type { SiteDetail } from '#shared/types/sites'
import { SitePatchSchema } from '#shared/schemas/sites'
import { requireRole, requireSiteAccess } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { changeSite } from '../../services/site-service'

export default defineEventHandler(async (event): Promise<SiteDetail> => {
  const user = requireRole(event, ['admin'])
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(SitePatchSchema))
  requireSiteAccess(user, id)
  return changeSite(user, id, patch)
})
