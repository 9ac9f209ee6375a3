// POST /api/visits/:id/texts { body }: the front desk texts the visit's patient (queued, audited).
import { FreeTextSchema } from '#shared/schemas/sms'
import type { TextThreadDto } from '#shared/types/sms'
import { BOOKING_ROLES, requireRole } from '../../../utils/auth'
import { numericParam, validateWith } from '../../../utils/errors'
import { sendFreeText } from '../../../services/sms/thread-service'

export default defineEventHandler(async (event): Promise<TextThreadDto> => {
  const user = requireRole(event, BOOKING_ROLES)
  const id = numericParam(event, 'id')
  const { body } = await readValidatedBody(event, validateWith(FreeTextSchema))
  const thread = await sendFreeText(id, body, user)
  setResponseStatus(event, 201)
  return thread
})
