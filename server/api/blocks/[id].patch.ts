// PATCH /api/blocks/:id: change a block; the merged block is validated again. `dryRun: true`
// answers the visits it would strand and writes nothing; a save flags them.
import type { BlockDto } from '#shared/types/rota-api'
import type { StrandedPreview } from '#shared/types/rebook'
import { readDryRun } from '../../utils/dry-run'
import { BlockPatchSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { changeBlock } from '../../services/rota-service'

export default defineEventHandler(async (event): Promise<(BlockDto & StrandedPreview) | StrandedPreview> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(BlockPatchSchema))
  const result = await changeBlock(user, id, patch, await readDryRun(event))
  return result.dryRun ? { strandedVisits: result.strandedVisits } : { ...result.saved, strandedVisits: result.strandedVisits }
})
