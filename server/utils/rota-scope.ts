// Which sites a rota list may show: the one asked for (checked), or all the caller's sites.
import type { SessionUser } from '#shared/types/auth'
import { requireSiteAccess } from './auth'
import type { Db } from './db'
import { listSiteDetails } from '../repositories/sites'

export async function rotaSiteIds(db: Db, user: SessionUser, siteId: number | undefined): Promise<number[]> {
  if (siteId !== undefined) {
    requireSiteAccess(user, siteId)
    return [siteId]
  }
  return (await listSiteDetails(db, user)).map((site) => site.id)
}
