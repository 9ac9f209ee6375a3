// Knex's own loader cannot import .ts migrations in an ESM project, so this source lists
// db/migrations/*.ts and imports them itself (works under tsx and vitest).
import { readdirSync } from 'node:fs'
import { dirname, join } from 'node:path'
import { fileURLToPath, pathToFileURL } from 'node:url'
import type { Knex } from 'knex'

const migrationsDir = join(dirname(fileURLToPath(import.meta.url)), 'migrations')

export const migrationSource: Knex.MigrationSource<string> = {
  async getMigrations() {
    return readdirSync(migrationsDir)
      .filter((name) => /^\d{14}_[a-z0-9-]+\.ts$/.test(name))
      .sort()
  },
  getMigrationName(name) {
    return name
  },
  async getMigration(name) {
    return import(pathToFileURL(join(migrationsDir, name)).href) as Promise<Knex.Migration>
  },
}

export const migratorConfig: Knex.MigratorConfig = {
  migrationSource,
  tableName: 'knex_migrations',
}
