// Pieces every benchmark under scripts/bench/ shares: a fresh demo database of its own, percentiles,
// a process's CPU time, and a day to book on that lies ahead of whatever today is.
import { readFileSync } from 'node:fs'
import type { Knex } from 'knex'
import { DateTime } from 'luxon'
import { createDb, dbSettingsFromEnv } from '../../db/connection'
import { migratorConfig } from '../../db/migration-source'
import { seedDemo } from '../../seeds/index'

/**
 * Drop and recreate `database`, migrate it and seed the demo. `adminDatabase` is an existing
 * database to connect to while creating it (the app user's grants cover `cuspline%` only).
 */
export async function freshBenchDatabase(database: string, options: { adminDatabase: string; poolMax?: number }): Promise<Knex> {
  const admin = createDb({ ...dbSettingsFromEnv(), database: options.adminDatabase })
  await admin.raw(`DROP DATABASE IF EXISTS \`${database}\``)
  await admin.raw(`CREATE DATABASE \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`)
  await admin.destroy()
  const db = createDb({ ...dbSettingsFromEnv(), database, poolMax: options.poolMax })
  await db.migrate.latest(migratorConfig)
  await seedDemo(db)
  return db
}

/** The value below which `share` (0–1) of `values` lie. */
export function percentile(values: readonly number[], share: number): number {
  const sorted = [...values].sort((a, b) => a - b)
  return sorted[Math.min(sorted.length - 1, Math.floor(share * sorted.length))]!
}

/** CPU seconds (user + system) a process has used so far, from /proc (Linux). */
export function cpuSeconds(pid: number): number {
  const fields = readFileSync(`/proc/${pid}/stat`, 'utf8').split(') ')[1]!.split(' ')
  return (Number(fields[11]) + Number(fields[12])) / 100
}

/** The Monday `weeksAhead` weeks after this week's, in `zone`, as a local date: benchmarks never book on a fixed calendar date. */
export function mondayAhead(weeksAhead: number, zone: string): string {
  const today = DateTime.now().setZone(zone).startOf('day')
  return today.minus({ days: today.weekday - 1 }).plus({ weeks: weeksAhead }).toISODate()!
}
