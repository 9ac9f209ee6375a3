// POST /api/visit/:token/reminders-off: the patient stops e-mail reminders. Also the target of the
// reminders' List-Unsubscribe header: a mail client's one-click POST (RFC 8058 §3.1) sends the form
// body `List-Unsubscribe=One-Click` (middleware/03.json-only.ts lets that one form through here).
// Invitations, changes and cancellations keep coming.
import type { PublicVisitDto } from '#shared/types/outbox'
import { remindersOffByPatient } from '../../../services/visit-link-service'
import { tokenParam } from '../../../utils/token-param'

export default defineEventHandler(async (event): Promise<PublicVisitDto> => {
  const token = tokenParam(event)
  const oneClick = /^application\/x-www-form-urlencoded/i.test(getRequestHeader(event, 'content-type') ?? '')
  return remindersOffByPatient(token, oneClick ? 'one-click unsubscribe' : 'patient link')
})
