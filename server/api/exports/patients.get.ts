// GET /api/exports/patients[?q=][&siteId=]: every patient, or those the search finds, as CSV (managers and
// admins), dates in that site's date order.
import { PatientsExportSchema } from '#shared/schemas/exports'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { clientIp } from '../../utils/client-ip'
import { exportPatients } from '../../services/export-service'

export default defineEventHandler(async (event): Promise<string> => {
  const user = requireRole(event, MANAGING_ROLES)
  const { q, siteId } = await getValidatedQuery(event, validateWith(PatientsExportSchema))
  const csv = await exportPatients(user, q, clientIp(event), siteId)
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', 'attachment; filename="patients.csv"')
  return csv
})
