// PATCH /api/providers/:id: kind, colour, template categories, active (admins only).
import type { ProviderSummary } from '#shared/types/people'
import { ProviderPatchSchema } from '#shared/schemas/people'
import { requireRole } from '../../utils/auth'
import { inTransaction } from '../../utils/db-retry'
import { notFound, numericParam, validateWith } from '../../utils/errors'
import { findProvider, updateProvider } from '../../repositories/providers'

export default defineEventHandler(async (event): Promise<ProviderSummary> => {
  requireRole(event, ['admin'])
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(ProviderPatchSchema))
  // In the retrying transaction helper, like a booking: a lock wait is retried, then answered 503.
  return inTransaction(async (db) => {
    if (!(await findProvider(db, id))) throw notFound('No such provider.')
    await updateProvider(db, id, patch)
    return (await findProvider(db, id))!
  })
})
