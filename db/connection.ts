// One way to open Knex on MariaDB, shared by the server, the scripts and the tests.
import knex, { type Knex } from 'knex'

export interface DbSettings {
  host: string
  port: number
  user: string
  password: string
  database: string
  poolMax?: number
  /** How long a statement waits for a row lock before MariaDB gives up (error 1205); its default is 50 s. */
  lockWaitSeconds?: number
}

interface RawConnection {
  query: (sql: string, cb: (err: Error | null, rows?: unknown) => void) => void
}

/**
 * On a Galera node (wsrep_on): a new connection's first read waits until the node has applied every
 * transaction the cluster committed before it (wsrep_sync_wait, a causality check), then reads go
 * back to the node's own pace. The app opens new connections after HAProxy moves writes to another
 * node, so what the old writer committed is there before the new writer's first booking reads.
 * Later reads need no wait: only the one writer writes. On a single MariaDB this is one SHOW.
 */
function catchUpOnGalera(connection: RawConnection, done: (err: Error | null) => void): void {
  connection.query("SHOW VARIABLES LIKE 'wsrep_on'", (err, rows) => {
    if (err) return done(err)
    const on = (rows as Array<{ Value?: string }> | undefined)?.[0]?.Value === 'ON'
    if (!on) return done(null)
    connection.query('SET SESSION wsrep_sync_wait = 1', (setErr) => {
      if (setErr) return done(setErr)
      connection.query('SELECT 1', (readErr) => {
        if (readErr) return done(readErr)
        connection.query('SET SESSION wsrep_sync_wait = 0', (resetErr) => done(resetErr))
      })
    })
  })
}

export function createDb(settings: DbSettings): Knex {
  return knex({
    client: 'mysql2',
    connection: {
      host: settings.host,
      port: Number(settings.port),
      user: settings.user,
      password: settings.password,
      database: settings.database,
      // DATETIME columns hold UTC instants; mysql2 must neither add nor remove the machine's offset.
      timezone: 'Z',
      // DATE columns hold site-local calendar dates: they come back as 'YYYY-MM-DD' as stored, never
      // as a Date (which would be an instant). DATETIME and TIMESTAMP still come back as Dates.
      // mysql2 takes a list of types here (its ConnectionOptions); knex's own typing says boolean.
      dateStrings: ['DATE'] as unknown as boolean,
      supportBigNumbers: true,
      // Lets server/repositories/round-trip.ts send a transaction's fixed statements together. Every
      // statement is still built by Knex with bound values; no SQL text is ever built from input.
      multipleStatements: true,
      charset: 'utf8mb4',
    },
    pool: {
      min: 0,
      max: settings.poolMax ?? 10,
      // NOW() and friends must also be UTC, whatever the server's own zone is. Transactions run at
      // READ COMMITTED (bookings rely on it: no gap locks, each statement sees the latest commits);
      // set once per connection, it saves each transaction the extra SET TRANSACTION round trip.
      afterCreate(connection: RawConnection, done: (err: Error | null, conn: unknown) => void) {
        const lockWait = settings.lockWaitSeconds ? `, SESSION innodb_lock_wait_timeout = ${Math.max(1, Math.round(settings.lockWaitSeconds))}` : ''
        connection.query(`SET time_zone = '+00:00', SESSION tx_isolation = 'READ-COMMITTED'${lockWait}`, (err) => {
          if (err) return done(err, connection)
          catchUpOnGalera(connection, (caughtUpErr) => done(caughtUpErr, connection))
        })
      },
    },
  })
}

/** Settings from the environment the provisioning scripts export (scripts/lib/env.sh). */
export function dbSettingsFromEnv(env: NodeJS.ProcessEnv = process.env): DbSettings {
  const password = env.NUXT_DB_PASSWORD ?? env.DB_PASSWORD
  if (!password) throw new Error('NUXT_DB_PASSWORD is not set: run this through scripts/with-env.sh')
  return {
    host: env.NUXT_DB_HOST ?? env.DB_HOST ?? '127.0.0.1',
    port: Number(env.NUXT_DB_PORT ?? env.DB_PORT ?? 3307),
    user: env.NUXT_DB_USER ?? env.DB_USER ?? 'cuspline',
    password,
    database: env.NUXT_DB_DATABASE ?? env.DB_NAME ?? 'cuspline',
  }
}
