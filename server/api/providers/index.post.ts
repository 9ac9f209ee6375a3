// POST /api/providers: make an existing staff account a provider (admins only).
import type { ProviderSummary } from '#shared/types/people'
import { ProviderSchema } from '#shared/schemas/people'
import { requireRole } from '../../utils/auth'
import { inTransaction } from '../../utils/db-retry'
import { badRequest, conflict, validateWith } from '../../utils/errors'
import { findProvider, findProviderIdOfUser, insertProvider } from '../../repositories/providers'
import { findUserById } from '../../repositories/users'

export default defineEventHandler(async (event): Promise<ProviderSummary> => {
  requireRole(event, ['admin'])
  const body = await readValidatedBody(event, validateWith(ProviderSchema))
  // In the retrying transaction helper, like a booking: a lock wait is retried, then answered 503.
  return inTransaction(async (db) => {
    if (!(await findUserById(db, body.userId))) throw badRequest('userId', 'is not a staff account')
    if ((await findProviderIdOfUser(db, body.userId)) !== null) throw conflict('This person is already a provider.', { field: 'userId' })
    const id = await insertProvider(db, body)
    setResponseStatus(event, 201)
    return (await findProvider(db, id))!
  })
})
