// PUT /api/templates/:id: save an edit as the template's next version (managers and admins).
import { TemplateSchema } from '#shared/schemas/templates'
import type { StoredTemplate } from '#shared/types/templates'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { reviseTemplate } from '../../services/template-service'

export default defineEventHandler(async (event): Promise<StoredTemplate> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const input = await readValidatedBody(event, validateWith(TemplateSchema))
  return reviseTemplate(id, input, user)
})
