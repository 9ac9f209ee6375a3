// GET /api/me: the signed-in user and the sites they may work with.
import type { MeResponse } from '#shared/types/auth'
import { requireUser } from '../utils/auth'
import { useDb } from '../utils/db'
import { listSites } from '../repositories/sites'

export default defineEventHandler(async (event): Promise<MeResponse> => {
  const user = requireUser(event)
  return { user, sites: await listSites(useDb(), user) }
})
