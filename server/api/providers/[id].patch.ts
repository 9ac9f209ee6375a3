// PATCH /api/providers/:id: kind, colour, template categories, active (admins only).
import type { ProviderSummary } from '#shared/types/people'
import { ProviderPatchSchema } from '#shared/schemas/people'
import { requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { changeProvider } from '../../services/people-service'

export default defineEventHandler(async (event): Promise<ProviderSummary> => {
  requireRole(event, ['admin'])
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(ProviderPatchSchema))
  return changeProvider(id, patch)
})
