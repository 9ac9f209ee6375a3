// Run Knex migrations: `tsx scripts/db-migrate.ts latest | rollback | rollback-all | status`.
import { createDb, dbSettingsFromEnv } from '../db/connection'
import { migratorConfig } from '../db/migration-source'

const command = process.argv[2] ?? 'latest'
const db = createDb(dbSettingsFromEnv())

try {
  if (command === 'latest') {
    const [, applied] = await db.migrate.latest(migratorConfig)
    console.log(applied.length ? `migrated: ${applied.join(', ')}` : 'migrations: up to date')
  } else if (command === 'rollback' || command === 'rollback-all') {
    const [, undone] = await db.migrate.rollback(migratorConfig, command === 'rollback-all')
    console.log(undone.length ? `rolled back: ${undone.join(', ')}` : 'nothing to roll back')
  } else if (command === 'status') {
    const [done, pending] = await db.migrate.list(migratorConfig)
    console.log(`applied ${done.length}, pending ${pending.length}`)
  } else {
    throw new Error(`unknown command "${command}" (latest, rollback, rollback-all, status)`)
  }
} finally {
  await db.destroy()
}
