// GET /api/patient-imports/:id/report: the import's report as a CSV download (line, outcome, patient, why).
import { toCsv } from '#shared/utils/csv'
import { MANAGING_ROLES, requireRole } from '../../../utils/auth'
import { numericParam } from '../../../utils/errors'
import { importReportFor } from '../../../services/patient-import-service'

export default defineEventHandler(async (event): Promise<string> => {
  const user = requireRole(event, MANAGING_ROLES)
  const { fileName, report } = await importReportFor(user, numericParam(event, 'id'))
  setResponseHeader(event, 'content-type', 'text/csv; charset=utf-8')
  setResponseHeader(event, 'content-disposition', `attachment; filename="import-${report.id}-report.csv"`)
  return toCsv(['Line', 'Outcome', 'Patient id', 'Why', 'File'], report.rows.map((row) => [row.line, row.outcome, row.patientId, row.note, fileName]))
})
