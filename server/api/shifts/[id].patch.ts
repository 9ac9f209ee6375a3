// PATCH /api/shifts/:id: change a shift; the merged shift is validated and clash-checked again.
// `dryRun: true` answers the visits it would strand and writes nothing; a save flags them.
import type { ShiftDto } from '#shared/types/rota-api'
import type { StrandedPreview } from '#shared/types/rebook'
import { readDryRun } from '../../utils/dry-run'
import { ShiftPatchSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { changeShift } from '../../services/rota-service'

export default defineEventHandler(async (event): Promise<(ShiftDto & StrandedPreview) | StrandedPreview> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(ShiftPatchSchema))
  const result = await changeShift(user, id, patch, await readDryRun(event))
  return result.dryRun ? { strandedVisits: result.strandedVisits } : { ...result.saved, strandedVisits: result.strandedVisits }
})
