// nuxt-auth-utils' own DELETE /api/_auth/session clears the cookie but cannot revoke copies of it;
// bumping the session version makes every copy useless.
import { useDb } from '../utils/db'
import { bumpSessionVersion } from '../repositories/users'
import { forgetCachedSession, sealedSessionOf } from '../utils/session-cache'

export default defineNitroPlugin(() => {
  sessionHooks.hook('clear', async (session, event) => {
    forgetCachedSession(sealedSessionOf(event))
    if (event.context.sessionAlreadyInvalid) return
    const userId = (session as { user?: { id?: number } }).user?.id
    if (userId) await bumpSessionVersion(useDb(), userId)
  })
})
