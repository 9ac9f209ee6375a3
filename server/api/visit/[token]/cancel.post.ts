// POST /api/visit/:token/cancel: the patient asks to cancel, optionally saying why; by the site's
// policy the front desk decides (default) or the visit is cancelled at once.
import type { PublicVisitDto } from '#shared/types/outbox'
import { PatientCancelSchema } from '#shared/schemas/outbox'
import { requestCancelByPatient } from '../../../services/visit-link-service'
import { tokenParam } from '../../../utils/token-param'
import { validateWith } from '../../../utils/errors'

export default defineEventHandler(async (event): Promise<PublicVisitDto> => {
  const token = tokenParam(event)
  const body = await readValidatedBody(event, validateWith(PatientCancelSchema))
  return requestCancelByPatient(token, body?.reason || undefined)
})
