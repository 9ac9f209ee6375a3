// POST /api/patient-imports/:id/run: import the valid rows in one transaction, with a choice per likely
// duplicate (skip, merge, create); answers the report. Running it again answers the same report.
import { ImportRunSchema } from '#shared/schemas/patient-imports'
import type { ImportReportDto } from '#shared/types/patient-imports'
import { MANAGING_ROLES, requireRole } from '../../../utils/auth'
import { numericParam, validateWith } from '../../../utils/errors'
import { clientIp } from '../../../utils/client-ip'
import { runImport } from '../../../services/patient-import-service'

export default defineEventHandler(async (event): Promise<ImportReportDto> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const input = await readValidatedBody(event, validateWith(ImportRunSchema))
  return runImport(user, id, input, clientIp(event))
})
