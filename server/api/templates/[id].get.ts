// GET /api/templates/:id: one version of a template (old versions stay readable).
import type { StoredTemplate } from '#shared/types/templates'
import { requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { notFound, numericParam } from '../../utils/errors'
import { findTemplateById } from '../../repositories/templates'

export default defineEventHandler(async (event): Promise<StoredTemplate> => {
  requireUser(event)
  const template = await findTemplateById(useDb(), numericParam(event, 'id'))
  if (!template) throw notFound('No such template.')
  return template
})
