// GET /api/visits/:id: one visit with its segments.
import type { VisitDto } from '#shared/types/visits'
import { requireSiteAccess, requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { notFound, numericParam } from '../../utils/errors'
import { findVisit } from '../../repositories/visits'

export default defineEventHandler(async (event): Promise<VisitDto> => {
  const user = requireUser(event)
  const visit = await findVisit(useDb(), numericParam(event, 'id'))
  if (!visit) throw notFound('No such visit.')
  requireSiteAccess(user, visit.siteId)
  return visit
})
