// Sign-in attempts, counted in MariaDB so the limits hold across app instances and restarts.
// `ip` holds the address the limits count against (an IPv6 address by its /64, see limitKeyOf).
import type { Db } from '../utils/db'

/**
 * Every attempt is written as a failure before its password is checked, so attempts running at the same
 * time (in this process or another) count each other; a correct one is then marked as a success.
 */
export async function recordPendingAttempt(db: Db, email: string, ip: string): Promise<number> {
  const [id] = await db('sign_in_attempts').insert({ email, ip, succeeded: false })
  return Number(id)
}

export async function markAttemptSucceeded(db: Db, id: number): Promise<void> {
  await db('sign_in_attempts').where({ id }).update({ succeeded: true })
}

/** A refused attempt is not a try: it does not count against anyone. */
export async function forgetAttempt(db: Db, id: number): Promise<void> {
  await db('sign_in_attempts').where({ id }).delete()
}

export interface FailureWindow {
  count: number
  /** When the oldest failure that counts was made (it leaves the window one window later). */
  oldestAt: Date | null
}

/** The later of the window's start and the last success matching `where`. */
async function sinceLastSuccess(db: Db, where: Record<string, string>, since: Date): Promise<Date> {
  const lastSuccess = await db('sign_in_attempts').where({ ...where, succeeded: true }).where('created_at', '>', since).max({ at: 'created_at' }).first()
  return lastSuccess?.at && new Date(lastSuccess.at) > since ? new Date(lastSuccess.at) : since
}

/**
 * The counts below take only attempts up to `upToId` (the caller's own pending one, which is left out):
 * of attempts racing each other, each sees exactly those that started before it.
 */

/** Failures for an account from every address, since the window opened or its last success. */
export async function accountFailures(db: Db, email: string, since: Date, upToId: number): Promise<FailureWindow> {
  return failuresWhere(db, { email }, await sinceLastSuccess(db, { email }, since), upToId)
}

/** Failures for an account from one address, since the window opened or that address's last success on it. */
export async function accountAddressFailures(db: Db, email: string, ip: string, since: Date, upToId: number): Promise<FailureWindow> {
  return failuresWhere(db, { email, ip }, await sinceLastSuccess(db, { email, ip }, since), upToId)
}

/** Failures from one address against every account in the window (successes do not reset these). */
export async function ipFailures(db: Db, ip: string, since: Date, upToId: number): Promise<FailureWindow> {
  return failuresWhere(db, { ip }, since, upToId)
}

async function failuresWhere(db: Db, where: Record<string, string>, since: Date, upToId: number): Promise<FailureWindow> {
  const row = await db('sign_in_attempts')
    .where({ ...where, succeeded: false })
    .where('created_at', '>', since)
    .where('id', '<', upToId)
    .count({ count: '*' })
    .min({ oldestAt: 'created_at' })
    .first()
  return { count: Number(row?.count ?? 0), oldestAt: row?.oldestAt ? new Date(row.oldestAt) : null }
}
