// DELETE /api/templates/:id: deactivate the template (its versions stay for booked visits).
import type { StoredTemplate } from '#shared/types/templates'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { numericParam } from '../../utils/errors'
import { deactivateTemplate } from '../../services/template-service'

export default defineEventHandler(async (event): Promise<StoredTemplate> => {
  const user = requireRole(event, MANAGING_ROLES)
  return deactivateTemplate(numericParam(event, 'id'), user)
})
