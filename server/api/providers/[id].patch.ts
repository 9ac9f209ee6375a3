// PATCH /api/providers/:id: kind, colour, template categories, active (admins only).
import type { ProviderSummary } from '#shared/types/people'
import { ProviderPatchSchema } from '#shared/schemas/people'
import { requireRole } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { notFound, numericParam, validateWith } from '../../utils/errors'
import { findProvider, updateProvider } from '../../repositories/providers'

export default defineEventHandler(async (event): Promise<ProviderSummary> => {
  requireRole(event, ['admin'])
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(ProviderPatchSchema))
  const db = useDb()
  if (!(await findProvider(db, id))) throw notFound('No such provider.')
  await updateProvider(db, id, patch)
  return (await findProvider(db, id))!
})
