// PATCH /api/blocks/:id: change a block; the merged block is validated again.
import type { BlockDto } from '#shared/types/rota-api'
import { BlockPatchSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { changeBlock } from '../../services/rota-service'

export default defineEventHandler(async (event): Promise<BlockDto> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(BlockPatchSchema))
  return changeBlock(user, id, patch)
})
