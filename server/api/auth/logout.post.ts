// POST /api/auth/logout: sign out and revoke this user's session cookies.
import { signOut } from '../../services/auth-service'

export default defineEventHandler(async (event) => {
  await signOut(event)
  return { ok: true }
})
