// Signing in and out: password check, attempt limits, session cookie, revocation.
import type { H3Event } from 'h3'
import type { SessionUser } from '#shared/types/auth'
import { useDb } from '../utils/db'
import { MESSAGES } from '../utils/errors'
import { clientIp, limitKeyOf } from '../utils/client-ip'
import { findUserByEmail, recordSignIn, siteIdsOfUser, toSessionUser, type UserRow } from '../repositories/users'
import { accountAddressFailures, accountFailures, forgetAttempt, ipFailures, markAttemptSucceeded, recordPendingAttempt, type FailureWindow } from '../repositories/sign-in-attempts'
import { writeAudit } from '../repositories/audit-log'
import { refusalFor, signInDelayMs, type SignInLimits } from '#shared/domain/sign-in-limits'

let dummyHash: Promise<string> | undefined
/** Unknown e-mails still cost one hash check, so timing does not reveal which accounts exist. */
function hashForUnknownAccounts(): Promise<string> {
  dummyHash ??= hashPassword('not-a-real-password-for-timing')
  return dummyHash
}

function limitsFromConfig(): SignInLimits & { windowMs: number } {
  const { auth } = useRuntimeConfig()
  return {
    windowMs: Number(auth.failureWindowMinutes) * 60_000,
    accountAddressFailureLimit: Number(auth.accountAddressFailureLimit),
    addressFailureLimit: Number(auth.ipFailureLimit),
    delayFreeFailures: Number(auth.delayFreeFailures),
    delayBaseMs: Number(auth.delayBaseMs),
    delayMaxMs: Number(auth.delayMaxMs),
  }
}

function retryAfterSeconds(window: FailureWindow, windowMs: number): number {
  return window.oldestAt
    ? Math.max(1, Math.ceil((window.oldestAt.getTime() + windowMs - Date.now()) / 1000))
    : Math.ceil(windowMs / 1000)
}

/**
 * OWASP ASVS 4.0.3 V2.2.1: an address that used up its tries (on this account, or on all accounts) is
 * refused with 429 and Retry-After. The account itself is never locked: the owner at another address
 * is not affected.
 */
async function refuseWhenLimited(event: H3Event, email: string, row: UserRow | undefined, address: string, limitKey: string, attemptId: number): Promise<void> {
  const limits = limitsFromConfig()
  const since = new Date(Date.now() - limits.windowMs)
  const db = useDb()
  const [pair, byAddress] = await Promise.all([accountAddressFailures(db, email, limitKey, since, attemptId), ipFailures(db, limitKey, since, attemptId)])
  const reason = refusalFor({ accountAddress: pair.count, address: byAddress.count }, limits)
  if (!reason) return
  await forgetAttempt(db, attemptId)
  const retryAfter = retryAfterSeconds(reason === 'address' ? byAddress : pair, limits.windowMs)
  await writeAudit(db, {
    userId: row?.id ?? null, action: 'sign_in_refused', entity: 'user', entityId: email, ip: address,
    after: { reason, failures: reason === 'address' ? byAddress.count : pair.count, retryAfterSeconds: retryAfter },
  })
  setResponseHeader(event, 'Retry-After', retryAfter)
  throw createError({ statusCode: 429, statusMessage: 'Too Many Requests', message: MESSAGES.tooManyAttempts, data: { retryAfterSeconds: retryAfter } })
}

/** The growing, capped wait for an account many addresses have been failing on (never a refusal). */
async function delayForAccount(email: string, attemptId: number): Promise<number> {
  const limits = limitsFromConfig()
  const failures = await accountFailures(useDb(), email, new Date(Date.now() - limits.windowMs), attemptId)
  const delayMs = signInDelayMs(failures.count, limits)
  if (delayMs > 0) await new Promise((resume) => setTimeout(resume, delayMs))
  return delayMs
}

export async function signIn(event: H3Event, rawEmail: string, password: string): Promise<SessionUser> {
  const email = rawEmail.trim().toLowerCase()
  const address = clientIp(event)
  const limitKey = limitKeyOf(address)
  const db = useDb()
  const row = await findUserByEmail(db, email)
  const attemptId = await recordPendingAttempt(db, email, limitKey)
  await refuseWhenLimited(event, email, row, address, limitKey, attemptId)
  const delayMs = await delayForAccount(email, attemptId)

  const passwordOk = row?.active
    ? await verifyPassword(row.password_hash, password)
    : (await verifyPassword(await hashForUnknownAccounts(), password), false)

  if (!row || !passwordOk) {
    // The attempt is already counted as a failure.
    await writeAudit(db, { userId: row?.id ?? null, action: 'sign_in_failed', entity: 'user', entityId: email, ip: address, after: { delayMs } })
    throw createError({ statusCode: 401, statusMessage: 'Unauthorized', message: MESSAGES.badCredentials })
  }

  await markAttemptSucceeded(db, attemptId)
  await recordSignIn(db, row.id)
  const user = toSessionUser(row, await siteIdsOfUser(db, row.id))
  const now = Date.now()
  await replaceUserSession(event, { user, sessionVersion: row.session_version, signedInAt: now, lastSeenAt: now })
  await writeAudit(db, { userId: row.id, action: 'sign_in', entity: 'user', entityId: row.id, ip: address, after: delayMs ? { delayMs } : undefined })
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
