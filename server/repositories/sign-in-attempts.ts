// Sign-in attempts, counted in MariaDB so the limits hold across app instances and restarts.
// `ip` holds the address the limits count against (an IPv6 address by its /64, see limitKeyOf).
import type { Db } from '../utils/db'

export async function recordAttempt(db: Db, email: string, ip: string, succeeded: boolean): Promise<void> {
  await db('sign_in_attempts').insert({ email, ip, succeeded })
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

/** Failures for an account from every address, since the window opened or its last success. */
export async function accountFailures(db: Db, email: string, since: Date): Promise<FailureWindow> {
  return failuresWhere(db, { email }, await sinceLastSuccess(db, { email }, since))
}

/** Failures for an account from one address, since the window opened or that address's last success on it. */
export async function accountAddressFailures(db: Db, email: string, ip: string, since: Date): Promise<FailureWindow> {
  return failuresWhere(db, { email, ip }, await sinceLastSuccess(db, { email, ip }, since))
}

/** Failures from one address against every account in the window (successes do not reset these). */
export async function ipFailures(db: Db, ip: string, since: Date): Promise<FailureWindow> {
  return failuresWhere(db, { ip }, since)
}

async function failuresWhere(db: Db, where: Record<string, string>, since: Date): Promise<FailureWindow> {
  const row = await db('sign_in_attempts')
    .where({ ...where, succeeded: false })
    .where('created_at', '>', since)
    .count({ count: '*' })
    .min({ oldestAt: 'created_at' })
    .first()
  return { count: Number(row?.count ?? 0), oldestAt: row?.oldestAt ? new Date(row.oldestAt) : null }
}
