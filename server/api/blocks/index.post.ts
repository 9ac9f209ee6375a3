// POST /api/blocks: unbookable time for a site, a room or a provider; one-off or recurring.
import type { BlockDto } from '#shared/types/rota-api'
import { BlockSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { saveBlock } from '../../services/rota-service'
import { inTransaction } from '../../utils/db-retry'

export default defineEventHandler(async (event): Promise<BlockDto> => {
  const user = requireRole(event, MANAGING_ROLES)
  const body = await readValidatedBody(event, validateWith(BlockSchema))
  requireSiteAccess(user, body.siteId)
  const block = await inTransaction((trx) => saveBlock(trx, user, body))
  setResponseStatus(event, 201)
  return block
})
