// GET /api/blocks?siteId=&providerId=: unbookable time at the caller's sites.
import type { BlockDto } from '#shared/types/rota-api'
import { RotaListQuerySchema } from '#shared/schemas/rota'
import { requireUser } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { blockList } from '../../services/rota-view-service'

export default defineEventHandler(async (event): Promise<BlockDto[]> => {
  const user = requireUser(event)
  const query = await getValidatedQuery(event, validateWith(RotaListQuerySchema))
  return blockList(user, query)
})
