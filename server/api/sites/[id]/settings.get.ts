// GET /api/sites/:id/settings: the site's patient-mail and booking settings, defaults filled in
// (admins and managers of the site).
import type { SiteSettings } from '#shared/domain/site-settings'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../../utils/auth'
import { useDb } from '../../../utils/db'
import { numericParam } from '../../../utils/errors'
import { siteSettings } from '../../../services/site-service'

export default defineEventHandler(async (event): Promise<SiteSettings> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  requireSiteAccess(user, id)
  return siteSettings(useDb(), id)
})
