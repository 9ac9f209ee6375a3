// PATCH /api/operatories/:id: rename a room, change its capabilities, order or active flag.
// `dryRun: true` answers the visits it would strand and writes nothing; a save flags them.
import type { OperatorySummary } from '#shared/types/sites'
import type { StrandedPreview } from '#shared/types/rebook'
import { readDryRun } from '../../utils/dry-run'
import { OperatoryPatchSchema } from '#shared/schemas/sites'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { changeOperatory } from '../../services/site-service'

export default defineEventHandler(async (event): Promise<(OperatorySummary & StrandedPreview) | StrandedPreview> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(OperatoryPatchSchema))
  const result = await changeOperatory(user, id, patch, await readDryRun(event))
  return result.dryRun ? { strandedVisits: result.strandedVisits } : { ...result.saved, strandedVisits: result.strandedVisits }
})
