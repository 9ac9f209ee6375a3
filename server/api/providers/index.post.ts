// POST /api/providers: make an existing staff account a provider (admins only).
import type { ProviderSummary } from '#shared/types/people'
import { ProviderSchema } from '#shared/schemas/people'
import { requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { createProvider } from '../../services/people-service'

export default defineEventHandler(async (event): Promise<ProviderSummary> => {
  requireRole(event, ['admin'])
  const body = await readValidatedBody(event, validateWith(ProviderSchema))
  const provider = await createProvider(body)
  setResponseStatus(event, 201)
  return provider
})
