// POST /api/visits/:id/undo: undo the visit's last state change (issue 13 §3). Who may, and when, is
// shared/domain/visit-undo.ts; a visit that gave its time back takes it again only while its chair,
// provider and patient are still free (409 naming what took the slot). Needs `rowVersion`.
import { VisitVersionSchema } from '#shared/schemas/visits'
import type { VisitDto } from '#shared/types/visits'
import { STAFF_ROLES, requireRole } from '../../../utils/auth'
import { numericParam, validateWith } from '../../../utils/errors'
import { undoVisitState } from '../../../services/booking-service'

export default defineEventHandler(async (event): Promise<VisitDto> => {
  const user = requireRole(event, STAFF_ROLES)
  const id = numericParam(event, 'id')
  const { rowVersion } = await readValidatedBody(event, validateWith(VisitVersionSchema))
  return undoVisitState(id, rowVersion, user)
})
