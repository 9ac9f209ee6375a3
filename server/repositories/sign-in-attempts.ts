// Sign-in attempts, counted in MariaDB so the limits hold across app instances and restarts.
import type { Db } from '../utils/db'

export async function recordAttempt(db: Db, email: string, ip: string, succeeded: boolean): Promise<void> {
  await db('sign_in_attempts').insert({ email, ip, succeeded })
}

export interface FailureWindow {
  count: number
  /** When the oldest failure that counts leaves the window. */
  oldestAt: Date | null
}

/** Failures for an account since the window opened or since its last success, whichever is later. */
export async function accountFailures(db: Db, email: string, since: Date): Promise<FailureWindow> {
  const lastSuccess = await db('sign_in_attempts').where({ email, succeeded: true }).max({ at: 'created_at' }).first()
  const from = lastSuccess?.at && new Date(lastSuccess.at) > since ? new Date(lastSuccess.at) : since
  return failuresWhere(db, { email }, from)
}

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
