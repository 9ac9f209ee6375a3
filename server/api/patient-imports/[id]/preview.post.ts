// POST /api/patient-imports/:id/preview: read the file with a column mapping (remembered for the site);
// every row's problems in words and its likely duplicates, in the file and in the database. Changes no patient.
import { ImportMappingSchema } from '#shared/schemas/patient-imports'
import type { ImportPreviewDto } from '#shared/types/patient-imports'
import { MANAGING_ROLES, requireRole } from '../../../utils/auth'
import { numericParam, validateWith } from '../../../utils/errors'
import { previewImport } from '../../../services/patient-import-service'

export default defineEventHandler(async (event): Promise<ImportPreviewDto> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const input = await readValidatedBody(event, validateWith(ImportMappingSchema))
  return previewImport(user, id, input)
})
