// POST /api/shifts: a provider's recurring hours at a site (admins, managers of the site).
// 409 when the provider would be at two sites at once.
import type { ShiftDto } from '#shared/types/rota-api'
import { ShiftSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { createShift } from '../../services/rota-service'

export default defineEventHandler(async (event): Promise<ShiftDto> => {
  const user = requireRole(event, MANAGING_ROLES)
  const body = await readValidatedBody(event, validateWith(ShiftSchema))
  requireSiteAccess(user, body.siteId)
  const shift = await createShift(user, body)
  setResponseStatus(event, 201)
  return shift
})
