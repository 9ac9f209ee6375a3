// POST /api/auth/login: sign in with e-mail and password.
import { SignInSchema } from '#shared/schemas/auth'
import type { SessionUser } from '#shared/types/auth'
import { validateWith } from '../../utils/errors'
import { signIn } from '../../services/auth-service'

export default defineEventHandler(async (event): Promise<{ user: SessionUser }> => {
  const { email, password } = await readValidatedBody(event, validateWith(SignInSchema))
  return { user: await signIn(event, email, password) }
})
