// PATCH /api/providers/:id: kind, colour, template categories, active (admins only).
// `dryRun: true` answers the visits it would strand and writes nothing; a save flags them.
import type { ProviderSummary } from '#shared/types/people'
import type { StrandedPreview } from '#shared/types/rebook'
import { readDryRun } from '../../utils/dry-run'
import { ProviderPatchSchema } from '#shared/schemas/people'
import { requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { changeProvider } from '../../services/people-service'

export default defineEventHandler(async (event): Promise<(ProviderSummary & StrandedPreview) | StrandedPreview> => {
  const user = requireRole(event, ['admin'])
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(ProviderPatchSchema))
  const result = await changeProvider(user, id, patch, await readDryRun(event))
  return result.dryRun ? { strandedVisits: result.strandedVisits } : { ...result.saved, strandedVisits: result.strandedVisits }
})
