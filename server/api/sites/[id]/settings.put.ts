// PUT /api/sites/:id/settings: replace the site's patient-mail and booking settings (admins and
// managers of the site). Every field is required; 400 names the first wrong one.
import type { SiteSettings } from '#shared/domain/site-settings'
import { SiteSettingsSchema } from '#shared/schemas/site-settings'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../../utils/auth'
import { numericParam, validateWith } from '../../../utils/errors'
import { changeSiteSettings } from '../../../services/site-service'

export default defineEventHandler(async (event): Promise<SiteSettings> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  requireSiteAccess(user, id)
  const body = await readValidatedBody(event, validateWith(SiteSettingsSchema))
  return changeSiteSettings(user, id, body)
})
