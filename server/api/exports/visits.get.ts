// GET /api/exports/visits?siteId&from&to: a site's visits over local dates (at most 93 days) as CSV
// (managers and admins of the site).
import { VisitsExportSchema } from '#shared/schemas/exports'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { clientIp } from '../../utils/client-ip'
import { exportVisits } from '../../services/export-service'

export default defineEventHandler(async (event): Promise<string> => {
  const user = requireRole(event, MANAGING_ROLES)
  const query = await getValidatedQuery(event, validateWith(VisitsExportSchema))
  const csv = await exportVisits(user, query, clientIp(event))
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="visits-${query.from}-${query.to}.csv"`)
  return csv
})
