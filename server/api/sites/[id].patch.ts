// PATCH /api/sites/:id: change a site's details, calendar or active flag (admins only).
// `dryRun: true` answers the visits new hours or closed dates would strand and writes nothing.
import type { SiteDetail } from '#shared/types/sites'
import type { StrandedPreview } from '#shared/types/rebook'
import { readDryRun } from '../../utils/dry-run'
import { SitePatchSchema } from '#shared/schemas/sites'
import { requireRole, requireSiteAccess } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { changeSite } from '../../services/site-service'

export default defineEventHandler(async (event): Promise<(SiteDetail & StrandedPreview) | StrandedPreview> => {
  const user = requireRole(event, ['admin'])
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(SitePatchSchema))
  requireSiteAccess(user, id)
  const result = await changeSite(user, id, patch, await readDryRun(event))
  return result.dryRun ? { strandedVisits: result.strandedVisits } : { ...result.saved, strandedVisits: result.strandedVisits }
})
