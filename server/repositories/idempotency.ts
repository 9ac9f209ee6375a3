// The first answer to a request sent with an Idempotency-Key, so a retry books nothing new.
import type { Db } from '../utils/db'
import { parseJson } from './json'

export interface StoredAnswer<T> {
  requestHash: string
  statusCode: number | null
  /** null while the first request is still in its transaction. */
  response: T | null
}

export async function findAnswer<T>(db: Db, userId: number, key: string): Promise<StoredAnswer<T> | undefined> {
  const row = await db('idempotency_keys').where({ user_id: userId, idempotency_key: key }).first()
  if (!row) return undefined
  return { requestHash: row.request_hash, statusCode: row.status_code, response: parseJson<T | null>(row.response, null) }
}

/**
 * Inserts the key inside the booking transaction. A second request with the same key blocks on the
 * primary key until the first commits (then fails with a duplicate key and replays the answer) or
 * rolls back (then goes ahead itself).
 */
export async function claimKey(db: Db, userId: number, key: string, requestHash: string): Promise<void> {
  await db('idempotency_keys').insert({ user_id: userId, idempotency_key: key, request_hash: requestHash })
}

export async function storeAnswer(db: Db, userId: number, key: string, statusCode: number, response: unknown, visitId: number | null): Promise<void> {
  await db('idempotency_keys').where({ user_id: userId, idempotency_key: key })
    .update({ status_code: statusCode, response: JSON.stringify(response), visit_id: visitId })
}
