// Signing in and out: password check, attempt limits, session cookie, revocation.
import type { H3Event } from 'h3'
import type { SessionUser } from '#shared/types/auth'
import { useDb } from '../utils/db'
import { MESSAGES } from '../utils/errors'
import { clientIp } from '../utils/client-ip'
import { findUserByEmail, recordSignIn, siteIdsOfUser, toSessionUser } from '../repositories/users'
import { accountFailures, ipFailures, recordAttempt, type FailureWindow } from '../repositories/sign-in-attempts'
import { writeAudit } from '../repositories/audit-log'

let dummyHash: Promise<string> | undefined
/** Unknown e-mails still cost one hash check, so timing does not reveal which accounts exist. */
function hashForUnknownAccounts(): Promise<string> {
  dummyHash ??= hashPassword('not-a-real-password-for-timing')
  return dummyHash
}

function tooManyAttempts(window: FailureWindow, windowMs: number) {
  const retryAfterSeconds = window.oldestAt
    ? Math.max(1, Math.ceil((window.oldestAt.getTime() + windowMs - Date.now()) / 1000))
    : Math.ceil(windowMs / 1000)
  return createError({
    statusCode: 429,
    statusMessage: 'Too Many Requests',
    message: MESSAGES.tooManyAttempts,
    data: { retryAfterSeconds },
  })
}

async function refuseWhenLimited(event: H3Event, email: string, ip: string): Promise<void> {
  const { auth } = useRuntimeConfig()
  const windowMs = Number(auth.failureWindowMinutes) * 60_000
  const since = new Date(Date.now() - windowMs)
  const db = useDb()
  const [byAccount, byIp] = await Promise.all([accountFailures(db, email, since), ipFailures(db, ip, since)])
  const limited = byAccount.count >= Number(auth.accountFailureLimit) ? byAccount
    : byIp.count >= Number(auth.ipFailureLimit) ? byIp : null
  if (!limited) return
  const error = tooManyAttempts(limited, windowMs)
  setResponseHeader(event, 'Retry-After', (error.data as { retryAfterSeconds: number }).retryAfterSeconds)
  throw error
}

export async function signIn(event: H3Event, rawEmail: string, password: string): Promise<SessionUser> {
  const email = rawEmail.trim().toLowerCase()
  const ip = clientIp(event)
  await refuseWhenLimited(event, email, ip)

  const db = useDb()
  const row = await findUserByEmail(db, email)
  const passwordOk = row?.active
    ? await verifyPassword(row.password_hash, password)
    : (await verifyPassword(await hashForUnknownAccounts(), password), false)

  if (!row || !passwordOk) {
    await recordAttempt(db, email, ip, false)
    await writeAudit(db, { userId: row?.id ?? null, action: 'sign_in_failed', entity: 'user', entityId: email, ip })
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: MESSAGES.badCredentials })
  }

  await recordAttempt(db, email, ip, true)
  await recordSignIn(db, row.id)
  const user = toSessionUser(row, await siteIdsOfUser(db, row.id))
  const now = Date.now()
  await replaceUserSession(event, { user, sessionVersion: row.session_version, signedInAt: now, lastSeenAt: now })
  await writeAudit(db, { userId: row.id, action: 'sign_in', entity: 'user', entityId: row.id, ip })
  return user
}

/** Signing out revokes every cookie of this user, not only the one in this browser. */
export async function signOut(event: H3Event): Promise<void> {
  const session = await getUserSession(event)
  if (session.user) {
    await writeAudit(useDb(), { userId: session.user.id, action: 'sign_out', entity: 'user', entityId: session.user.id, ip: clientIp(event) })
  }
  // The session-clear hook (server/plugins/revoke-on-session-clear.ts) bumps the version.
  await clearUserSession(event)
}
