// Checks the sealed session cookie against the database on every API call: a cookie from before
// a sign-out, password change or deactivation, or one idle or too old, is cleared. The fresh user
// (role and sites as they are now) is put on event.context.currentUser for requireUser().
// Every /api/ route is covered, nuxt-auth-utils' own GET /api/_auth/session too: a refused cookie is
// also taken off this request, so no later getUserSession() in it unseals the old cookie again.
// The unsealing itself is skipped for a cookie unsealed in the last half minute (server/utils/session-cache.ts);
// every check below runs on every request all the same.
import type { H3Event } from 'h3'
import { useDb } from '../utils/db'
import { findUserWithSites, toSessionUser } from '../repositories/users'
import { forgetCachedSession, rememberSession, restoreCachedSession, sealedSessionOf, sessionName } from '../utils/session-cache'

const REFRESH_EVERY_MS = 60_000

/** h3 reads the sealed session from the cookie or from an `x-<name>-session` header; drop both. */
function forgetSessionOfRequest(event: H3Event): void {
  const name = sessionName()
  const headers = event.node.req.headers
  // eslint-disable-next-line @typescript-eslint/no-dynamic-delete -- the header's name depends on the session name
  delete headers[`x-${name.toLowerCase()}-session`]
  if (headers.cookie) {
    headers.cookie = headers.cookie.split(';').map((pair) => pair.trim()).filter((pair) => pair && pair.split('=')[0] !== name).join('; ')
  }
  // clearUserSession() above dropped the cached session too, so a later read starts an empty one.
}

export default defineEventHandler(async (event) => {
  if (!event.path.startsWith('/api/')) return
  const sealed = sealedSessionOf(event)
  const cached = sealed !== undefined && restoreCachedSession(event, sealed)
  const session = await getUserSession(event)
  if (!session.user) return

  const { auth } = useRuntimeConfig()
  const idleMs = Number(auth.idleMinutes) * 60_000
  const lifetimeMs = Number(auth.absoluteHours) * 3_600_000
  const now = Date.now()
  const expired = !session.signedInAt || now - session.signedInAt > lifetimeMs || !session.lastSeenAt || now - session.lastSeenAt > idleMs

  const db = useDb()
  const found = expired ? undefined : await findUserWithSites(db, session.user.id)
  const row = found?.row
  if (!found || !row || !row.active || row.session_version !== session.sessionVersion) {
    // Already invalid: clearing it must not revoke the user's other, still valid cookies.
    event.context.sessionAlreadyInvalid = true
    forgetCachedSession(sealed)
    await clearUserSession(event)
    forgetSessionOfRequest(event)
    return
  }

  event.context.currentUser = toSessionUser(row, found.siteIds)
  if (!cached && sealed !== undefined) {
    const unsealed = (event.context.sessions as Record<string, { id: string; createdAt: number; data: Record<string, unknown> }> | undefined)?.[sessionName()]
    if (unsealed) rememberSession(sealed, unsealed, now)
  }
  if (now - session.lastSeenAt > Math.min(REFRESH_EVERY_MS, idleMs / 2)) {
    const { id: _sessionId, ...data } = session
    await setUserSession(event, { ...data, lastSeenAt: now })
  }
})
