// POST /api/blocks: unbookable time for a site, a room or a provider; one-off or recurring.
import type { BlockDto } from '#shared/types/rota-api'
import { BlockSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { createBlock } from '../../services/rota-service'

export default defineEventHandler(async (event): Promise<BlockDto> => {
  const user = requireRole(event, MANAGING_ROLES)
  const body = await readValidatedBody(event, validateWith(BlockSchema))
  requireSiteAccess(user, body.siteId)
  const block = await createBlock(user, body)
  setResponseStatus(event, 201)
  return block
})
