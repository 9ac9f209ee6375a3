// DELETE /api/shift-exceptions/:id: withdraw time off or an extra day. `?dryRun=true` answers the
// visits withdrawing an extra day would strand and writes nothing.
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam } from '../../utils/errors'
import { deleteShiftException } from '../../services/rota-service'
import { readDryRun } from '../../utils/dry-run'
import type { StrandedPreview } from '#shared/types/rebook'

export default defineEventHandler(async (event): Promise<StrandedPreview & { ok?: true }> => {
  const user = requireRole(event, MANAGING_ROLES)
  const result = await deleteShiftException(user, numericParam(event, 'id'), await readDryRun(event))
  return result.dryRun ? { strandedVisits: result.strandedVisits } : { ok: true, strandedVisits: result.strandedVisits }
})
