// PUT /api/patients/:id/recall-intervals { cleaning, exam }: set the patient's own recall interval per
// kind in months (1–36), or null for the site's default. Booking roles and the clinicians (dentists,
// hygienists), who decide how often a patient is seen. The next finished visit uses it.
import type { RecallIntervalDto } from '#shared/types/recall'
import { RecallIntervalsSchema } from '#shared/schemas/recall'
import { ROLE_GROUPS } from '#shared/utils/access'
import { requireRole } from '../../../utils/auth'
import { numericParam, validateWith } from '../../../utils/errors'
import { savePatientRecallIntervals } from '../../../services/recall-service'

const MAY_SET = [...ROLE_GROUPS.booking, ...ROLE_GROUPS.providers]

export default defineEventHandler(async (event): Promise<RecallIntervalDto[]> => {
  const user = requireRole(event, MAY_SET)
  const id = numericParam(event, 'id')
  const input = await readValidatedBody(event, validateWith(RecallIntervalsSchema))
  return savePatientRecallIntervals(id, input, user)
})
