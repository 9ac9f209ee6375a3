// GET /api/visits/:id/ics?token=…: the visit's current calendar event (RFC 5545), for the
// patient's link. The token must be the signed one for this visit.
import { VisitTokenQuerySchema } from '#shared/schemas/outbox'
import { numericParam, validateWith } from '../../../utils/errors'
import { currentCalendar } from '../../../services/visit-link-service'

export default defineEventHandler(async (event): Promise<string> => {
  const id = numericParam(event, 'id')
  const { token } = await getValidatedQuery(event, validateWith(VisitTokenQuerySchema))
  const { ics, method } = await currentCalendar(id, token)
  setResponseHeader(event, 'content-type', `text/calendar; charset=utf-8; method=${method}`)
  setResponseHeader(event, 'content-disposition', `attachment; filename="dental-visit-${id}.ics"`)
  setResponseHeader(event, 'cache-control', 'no-store')
  return ics
})
