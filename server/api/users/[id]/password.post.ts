// POST /api/users/:id/password: set a new password (admins only); the person's sessions end.
import { PasswordResetSchema } from '#shared/schemas/people'
import { requireRole } from '../../../utils/auth'
import { numericParam, validateWith } from '../../../utils/errors'
import { resetPassword } from '../../../services/people-service'

export default defineEventHandler(async (event): Promise<{ ok: true }> => {
  const user = requireRole(event, ['admin'])
  const id = numericParam(event, 'id')
  const { password } = await readValidatedBody(event, validateWith(PasswordResetSchema))
  await resetPassword(user, id, password)
  return { ok: true }
})
