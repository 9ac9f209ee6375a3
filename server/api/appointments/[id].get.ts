// GET /api/appointments/:id: one visit with its segments.
import type { AppointmentDto } from '#shared/types/appointments'
import { requireSiteAccess, requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { notFound, numericParam } from '../../utils/errors'
import { findAppointment } from '../../repositories/appointments'

export default defineEventHandler(async (event): Promise<AppointmentDto> => {
  const user = requireUser(event)
  const visit = await findAppointment(useDb(), numericParam(event, 'id'))
  if (!visit) throw notFound('No such visit.')
  requireSiteAccess(user, visit.siteId)
  return visit
})
