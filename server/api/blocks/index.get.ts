// GET /api/blocks?siteId=&providerId=: unbookable time at the caller's sites.
import type { BlockDto } from '#shared/types/rota-api'
import { RotaListQuerySchema } from '#shared/schemas/rota'
import { requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { validateWith } from '../../utils/errors'
import { rotaSiteIds } from '../../utils/rota-scope'
import { listBlocks } from '../../repositories/blocks'

export default defineEventHandler(async (event): Promise<BlockDto[]> => {
  const user = requireUser(event)
  const query = await getValidatedQuery(event, validateWith(RotaListQuerySchema))
  const db = useDb()
  return listBlocks(db, { siteIds: await rotaSiteIds(db, user, query.siteId), providerId: query.providerId })
})
