// DELETE /api/blocks/:id: remove a block (admins, managers of its site). Removing one only frees
// time: `?dryRun=true` answers an empty `strandedVisits` and writes nothing, like the other changes.
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam } from '../../utils/errors'
import { deleteBlock } from '../../services/rota-service'
import { readDryRun } from '../../utils/dry-run'
import type { StrandedPreview } from '#shared/types/rebook'

export default defineEventHandler(async (event): Promise<StrandedPreview & { ok?: true }> => {
  const user = requireRole(event, MANAGING_ROLES)
  const result = await deleteBlock(user, numericParam(event, 'id'), await readDryRun(event))
  return result.dryRun ? { strandedVisits: result.strandedVisits } : { ok: true, strandedVisits: result.strandedVisits }
})
