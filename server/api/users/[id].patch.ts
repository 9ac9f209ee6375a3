// PATCH /api/users/:id: name, role, site scope, or deactivate/reactivate (admins only).
// `dryRun: true` answers the visits deactivating a provider would strand and writes nothing.
import type { StaffAccount } from '#shared/types/people'
import type { StrandedPreview } from '#shared/types/rebook'
import { readDryRun } from '../../utils/dry-run'
import { StaffPatchSchema } from '#shared/schemas/people'
import { requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { changeStaff } from '../../services/people-service'

export default defineEventHandler(async (event): Promise<(StaffAccount & StrandedPreview) | StrandedPreview> => {
  const user = requireRole(event, ['admin'])
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(StaffPatchSchema))
  const result = await changeStaff(user, id, patch, await readDryRun(event))
  return result.dryRun ? { strandedVisits: result.strandedVisits } : { ...result.saved, strandedVisits: result.strandedVisits }
})
