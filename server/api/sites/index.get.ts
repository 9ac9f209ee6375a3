// GET /api/sites: the sites in the caller's scope.
import type { SiteSummary } from '#shared/types/auth'
import { requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { listSites } from '../../repositories/sites'

export default defineEventHandler(async (event): Promise<SiteSummary[]> => {
  const user = requireUser(event)
  return listSites(useDb(), user)
})
