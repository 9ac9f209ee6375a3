// MariaDB answers a deadlock (1213, also Galera's certification failure) or a lock wait timeout
// (1205) by rolling back; the whole transaction is then safe to run again.
import { useDb, type Db } from './db'

const RETRYABLE = new Set([1213, 1205])
const ATTEMPTS = 3

function isRetryable(error: unknown): boolean {
  return RETRYABLE.has((error as { errno?: number }).errno ?? 0)
}

async function withTransactionRetry<T>(work: () => Promise<T>): Promise<T> {
  for (let attempt = 1; ; attempt += 1) {
    try {
      return await work()
    } catch (error) {
      if (!isRetryable(error)) throw error
      if (attempt >= ATTEMPTS) {
        throw createError({ statusCode: 503, statusMessage: 'Service Unavailable', message: 'The schedule is very busy right now. Please try again.' })
      }
      await new Promise((wait) => setTimeout(wait, 10 + Math.random() * 40 * attempt))
    }
  }
}

/**
 * The one way to run a write transaction: bookings, patient links, rota, sites, rooms, people,
 * patients and templates all come here, so a deadlock or a lock wait during a burst of bookings is
 * retried, then answered 503 in words. Called by the service's write function, never by a handler;
 * a service composed into another's transaction takes that `trx` instead of opening its own.
 * `work` may run up to three times: it must do nothing outside the transaction it is given.
 */
export function inTransaction<T>(work: (trx: Db) => Promise<T>): Promise<T> {
  return withTransactionRetry(() => useDb().transaction(work))
}
