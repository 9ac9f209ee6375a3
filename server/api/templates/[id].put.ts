// PUT /api/templates/:id: save an edit as the template's next version (managers and admins).
// `dryRun: true` answers the visits a new capability or category would strand and writes nothing.
import { TemplateSchema } from '#shared/schemas/templates'
import type { StoredTemplate } from '#shared/types/templates'
import type { StrandedPreview } from '#shared/types/rebook'
import { readDryRun } from '../../utils/dry-run'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { reviseTemplate } from '../../services/template-service'

export default defineEventHandler(async (event): Promise<(StoredTemplate & StrandedPreview) | StrandedPreview> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const input = await readValidatedBody(event, validateWith(TemplateSchema))
  const result = await reviseTemplate(id, input, user, await readDryRun(event))
  return result.dryRun ? { strandedVisits: result.strandedVisits } : { ...result.saved, strandedVisits: result.strandedVisits }
})
