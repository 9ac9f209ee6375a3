// POST /api/recall-times/:token/book { startUtc, operatoryId, providerId }: the patient takes one of the
// recall page's times, booked through the booking transaction (201); 409 "that time has just gone"
// with fresh openings in `data.openings`, 409 when a visit is already booked, 410 when the link expired.
import type { PublicRecallDto } from '#shared/types/recall-page'
import { RecallBookSchema } from '#shared/schemas/recall'
import { validateWith } from '../../../utils/errors'
import { bookFromRecall } from '../../../services/recall-page-service'
import { recallTokenParam } from '../../../utils/token-param'

export default defineEventHandler(async (event): Promise<PublicRecallDto> => {
  const token = recallTokenParam(event)
  const input = await readValidatedBody(event, validateWith(RecallBookSchema))
  const page = await bookFromRecall(token, input)
  setResponseStatus(event, 201)
  return page
})
