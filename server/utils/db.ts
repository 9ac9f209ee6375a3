// The one Knex instance of this server process, opened lazily from runtime config.
import type { Knex } from 'knex'
import { createDb } from '../../db/connection'

let instance: Knex | undefined

export type Db = Knex | Knex.Transaction

export function useDb(): Knex {
  if (!instance) {
    const { db } = useRuntimeConfig()
    if (!db.password) {
      throw new Error('Database password missing: set NUXT_DB_PASSWORD (scripts/lib/env.sh does this).')
    }
    instance = createDb({ ...db, port: Number(db.port), lockWaitSeconds: Number(db.lockWaitSeconds), poolMax: 20 })
  }
  return instance
}
