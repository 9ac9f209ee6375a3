// POST /api/templates: a new template (managers and admins).
import { TemplateSchema } from '#shared/schemas/templates'
import type { StoredTemplate } from '#shared/types/templates'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { createTemplate } from '../../services/template-service'

export default defineEventHandler(async (event): Promise<StoredTemplate> => {
  const user = requireRole(event, MANAGING_ROLES)
  const input = await readValidatedBody(event, validateWith(TemplateSchema))
  setResponseStatus(event, 201)
  return createTemplate(input, user)
})
