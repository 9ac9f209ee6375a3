// POST /api/visits/:id/anaesthetic: record "anaesthetic given" now (issue 13 §4); the numbing
// countdown runs from it. The visit's provider, an assistant, a manager or an admin of the site
// (shared/domain/visit-access.ts mayRecordAnaesthetic). Needs `rowVersion`.
import { VisitVersionSchema } from '#shared/schemas/visits'
import type { VisitDto } from '#shared/types/visits'
import { STAFF_ROLES, requireRole } from '../../../utils/auth'
import { numericParam, validateWith } from '../../../utils/errors'
import { recordAnaesthetic } from '../../../services/booking-service'

export default defineEventHandler(async (event): Promise<VisitDto> => {
  const user = requireRole(event, STAFF_ROLES)
  const id = numericParam(event, 'id')
  const { rowVersion } = await readValidatedBody(event, validateWith(VisitVersionSchema))
  return recordAnaesthetic(id, rowVersion, user)
})
