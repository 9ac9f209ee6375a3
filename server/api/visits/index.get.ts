// GET /api/visits?siteId|providerId&from&to: visits overlapping a UTC range. Answers 304
// when nothing changed since the ETag the caller holds, so boards can poll cheaply.
import { createHash } from 'node:crypto'
import { VisitListQuerySchema } from '#shared/schemas/visits'
import type { BoardVisitDto } from '#shared/types/visits'
import { STAFF_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { visitsFor } from '../../services/visit-list-service'

export default defineEventHandler(async (event): Promise<BoardVisitDto[] | null> => {
  const user = requireRole(event, STAFF_ROLES)
  const query = await getValidatedQuery(event, validateWith(VisitListQuerySchema))
  const visits = await visitsFor({
    siteId: query.siteId, providerId: query.providerId, patientId: query.patientId, fromMs: Date.parse(query.fromUtc), toMs: Date.parse(query.toUtc),
    includeCancelled: query.includeCancelled === 'true',
  }, user)
  const etag = `"${createHash('sha1').update(JSON.stringify(visits)).digest('base64url')}"`
  setResponseHeader(event, 'ETag', etag)
  setResponseHeader(event, 'Cache-Control', 'private, no-cache')
  if (getRequestHeader(event, 'if-none-match') === etag) {
    setResponseStatus(event, 304)
    return null
  }
  return visits
})
