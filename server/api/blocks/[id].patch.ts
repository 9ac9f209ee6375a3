// PATCH /api/blocks/:id: change a block; the merged block is validated again.
import type { BlockDto } from '#shared/types/rota-api'
import { BlockPatchSchema, BlockSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { assertValid, notFound, numericParam, validateWith } from '../../utils/errors'
import { findBlock } from '../../repositories/blocks'
import { saveBlock } from '../../services/rota-service'
import { inTransaction } from '../../utils/db-retry'

export default defineEventHandler(async (event): Promise<BlockDto> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(BlockPatchSchema))
  return inTransaction(async (trx) => {
    const before = await findBlock(trx, id)
    if (!before) throw notFound('No such block.')
    requireSiteAccess(user, before.siteId)
    const { id: _id, ruleText: _text, ...stored } = before
    return saveBlock(trx, user, assertValid(BlockSchema, { ...stored, ...patch }), before)
  })
})
