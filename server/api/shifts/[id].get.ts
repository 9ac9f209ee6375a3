// GET /api/shifts/:id: one shift, if its site is in the caller's scope.
import type { ShiftDto } from '#shared/types/rota-api'
import { requireSiteAccess, requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { notFound, numericParam } from '../../utils/errors'
import { findShift } from '../../repositories/shifts'

export default defineEventHandler(async (event): Promise<ShiftDto> => {
  const user = requireUser(event)
  const shift = await findShift(useDb(), numericParam(event, 'id'))
  if (!shift) throw notFound('No such shift.')
  requireSiteAccess(user, shift.siteId)
  return shift
})
