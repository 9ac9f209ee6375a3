// POST /api/sites: a new site (admins only).
import type { SiteDetail } from '#shared/types/sites'
import { SiteSchema } from '#shared/schemas/sites'
import { requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { createSite } from '../../services/site-service'

export default defineEventHandler(async (event): Promise<SiteDetail> => {
  const user = requireRole(event, ['admin'])
  const body = await readValidatedBody(event, validateWith(SiteSchema))
  setResponseStatus(event, 201)
  return createSite(user, body)
})
