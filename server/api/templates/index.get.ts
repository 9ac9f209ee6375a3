// GET /api/templates?includeInactive=true: the current version of every template.
import { z } from 'zod'
import type { StoredTemplate } from '#shared/types/templates'
import { requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { validateWith } from '../../utils/errors'
import { listCurrentTemplates } from '../../repositories/templates'

const Query = z.object({ includeInactive: z.enum(['true', 'false']).optional() })

export default defineEventHandler(async (event): Promise<StoredTemplate[]> => {
  requireUser(event)
  const query = await getValidatedQuery(event, validateWith(Query))
  return listCurrentTemplates(useDb(), { includeInactive: query.includeInactive === 'true' })
})
