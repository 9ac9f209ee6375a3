// POST /api/recalls/mail: preview (`preview: true`) or send recall e-mails to chosen patients; a patient
// contacted within the site's minimum interval is skipped with the reason.
import type { RecallMailResult } from '#shared/types/recall'
import { RecallMailSchema } from '#shared/schemas/recall'
import { BOOKING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { mailRecalls } from '../../services/recall-service'

export default defineEventHandler(async (event): Promise<RecallMailResult> => {
  const user = requireRole(event, BOOKING_ROLES)
  const input = await readValidatedBody(event, validateWith(RecallMailSchema))
  return mailRecalls(input, user)
})
