// DELETE /api/shifts/:id: remove a shift (admins, managers of its site). `?dryRun=true` answers the
// visits it would strand and writes nothing; a save flags them.
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam } from '../../utils/errors'
import { deleteShift } from '../../services/rota-service'
import { readDryRun } from '../../utils/dry-run'
import type { StrandedPreview } from '#shared/types/rebook'

export default defineEventHandler(async (event): Promise<StrandedPreview & { ok?: true }> => {
  const user = requireRole(event, MANAGING_ROLES)
  const result = await deleteShift(user, numericParam(event, 'id'), await readDryRun(event))
  return result.dryRun ? { strandedVisits: result.strandedVisits } : { ok: true, strandedVisits: result.strandedVisits }
})
