// POST /api/patient-imports: upload a CSV file of patients (managers and admins) as JSON text
// `{ siteId, fileName, csv }`; at most 10 MB (413 beyond). Answers the headers, a sample and the mapping.
import { ImportUploadSchema } from '#shared/schemas/patient-imports'
import type { ImportUploadDto } from '#shared/types/patient-imports'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { uploadImport } from '../../services/patient-import-service'

export default defineEventHandler(async (event): Promise<ImportUploadDto> => {
  const user = requireRole(event, MANAGING_ROLES)
  const input = await readValidatedBody(event, validateWith(ImportUploadSchema))
  const upload = await uploadImport(user, input)
  setResponseStatus(event, 201)
  return upload
})
