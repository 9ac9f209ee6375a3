// GET /api/sites: the active sites in the caller's scope (?includeInactive=true for admins' table),
// each with contact and calendar fields beside the summary fields.
import { z } from 'zod'
import type { SiteDetail } from '#shared/types/sites'
import { requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { validateWith } from '../../utils/errors'
import { listSiteDetails } from '../../repositories/sites'

const QuerySchema = z.object({ includeInactive: z.enum(['true', 'false'], { error: 'must be true or false' }).optional() })

export default defineEventHandler(async (event): Promise<SiteDetail[]> => {
  const user = requireUser(event)
  const { includeInactive } = await getValidatedQuery(event, validateWith(QuerySchema))
  const sites = await listSiteDetails(useDb(), user)
  return includeInactive === 'true' && user.role === 'admin' ? sites : sites.filter((site) => site.active)
})
