// GET /api/patients/:id/recall-intervals: the patient's own recall interval per kind (null: the site's
// default applies) beside the default of their preferred site.
import type { RecallIntervalDto } from '#shared/types/recall'
import { STAFF_ROLES, requireRole } from '../../../utils/auth'
import { numericParam } from '../../../utils/errors'
import { patientRecallIntervals } from '../../../services/recall-service'

export default defineEventHandler(async (event): Promise<RecallIntervalDto[]> => {
  requireRole(event, STAFF_ROLES)
  return patientRecallIntervals(numericParam(event, 'id'))
})
