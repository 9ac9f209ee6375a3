// Migrations run up and down cleanly, and the demo seed is deterministic, on a scratch database.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Knex } from 'knex'
import { createDb, dbSettingsFromEnv } from '../../db/connection'
import { migratorConfig } from '../../db/migration-source'
import { seedDemo } from '../../seeds/index'
import { closeTestDb, testDb } from '../helpers/db'

const SCRATCH = 'cuspline_migration_check'
let scratch: Knex

async function tableNames(db: Knex): Promise<string[]> {
  const [rows] = await db.raw('SHOW TABLES')
  return (rows as Record<string, string>[]).map((row) => Object.values(row)[0]!).filter((name) => !name.startsWith('knex_')).sort()
}

beforeAll(async () => {
  await testDb().raw(`DROP DATABASE IF EXISTS \`${SCRATCH}\``)
  await testDb().raw(`CREATE DATABASE \`${SCRATCH}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`)
  scratch = createDb({ ...dbSettingsFromEnv(), database: SCRATCH })
})

afterAll(async () => {
  await scratch.destroy()
  await testDb().raw(`DROP DATABASE IF EXISTS \`${SCRATCH}\``)
  await closeTestDb()
})

describe('migrations', () => {
  it('creates every table, rolls all of them back, and applies again', async () => {
    await scratch.migrate.latest(migratorConfig)
    expect(await tableNames(scratch)).toEqual([
      'appointment_segments', 'appointments', 'audit_log', 'blocks', 'idempotency_keys', 'operatories', 'outbox',
      'patients', 'procedure_templates', 'providers', 'shift_exceptions', 'shifts', 'sign_in_attempts', 'sites',
      'user_sites', 'users',
    ])
    await scratch.migrate.rollback(migratorConfig, true)
    expect(await tableNames(scratch)).toEqual([])
    await scratch.migrate.latest(migratorConfig)
    expect((await tableNames(scratch)).length).toBe(16)
  })

  it('stores DATETIME values as UTC whatever the session zone was', async () => {
    const [row] = await scratch.raw('SELECT @@session.time_zone AS zone')
    expect((row as { zone: string }[])[0]!.zone).toBe('+00:00')
  })
})

describe('demo seed', () => {
  // Seeded into the scratch database: other test files add their own rows to cuspline_test.
  const patientsOf = (db: Knex) => db('patients').orderBy('id').select('first_name', 'last_name', 'date_of_birth', 'email', 'phone')
  const usersOf = (db: Knex) => db('users').orderBy('id').select('email', 'name', 'role')

  it('gives the same data for the same seed', async () => {
    await seedDemo(scratch)
    const first = { patients: await patientsOf(scratch), users: await usersOf(scratch) }
    await scratch.migrate.rollback(migratorConfig, true)
    await scratch.migrate.latest(migratorConfig)
    await seedDemo(scratch)
    expect({ patients: await patientsOf(scratch), users: await usersOf(scratch) }).toEqual(first)
  })

  it('has the glossary\'s sites, sign-ins and about 300 patients', async () => {
    const db = scratch
    const sites = await db('sites').orderBy('id').select('name', 'time_zone')
    expect(sites).toEqual([
      { name: 'Fernhollow Quarry Street', time_zone: 'America/Los_Angeles' },
      { name: 'Fernhollow Aspen Gulch', time_zone: 'America/Denver' },
      { name: 'Fernhollow Saguaro Flats', time_zone: 'America/Phoenix' },
    ])
    const rooms = await db('operatories').groupBy('site_id').orderBy('site_id').select('site_id').count({ count: '*' })
    expect(rooms.map((row) => Number(row.count))).toEqual([5, 4, 3])
    const roles = await db('users').whereIn('email', [
      'admin@fernhollow.test', 'manager@fernhollow.test', 'desk.quarry@fernhollow.test', 'desk.aspen@fernhollow.test',
      'dentist@fernhollow.test', 'hygienist@fernhollow.test',
    ]).orderBy('email').select('email', 'role')
    expect(roles).toEqual([
      { email: 'admin@fernhollow.test', role: 'admin' },
      { email: 'dentist@fernhollow.test', role: 'dentist' },
      { email: 'desk.aspen@fernhollow.test', role: 'front_desk' },
      { email: 'desk.quarry@fernhollow.test', role: 'front_desk' },
      { email: 'hygienist@fernhollow.test', role: 'hygienist' },
      { email: 'manager@fernhollow.test', role: 'manager' },
    ])
    const providers = await db('providers').groupBy('kind').orderBy('kind').select('kind').count({ count: '*' })
    expect(providers.map((row) => [(row as { kind: string }).kind, Number(row.count)])).toEqual([['dentist', 4], ['hygienist', 3]])
    const patients = await db('patients').count({ count: '*' }).first()
    expect(Number(patients!.count)).toBe(300)
    const foreignEmails = await db('patients').whereNotNull('email').whereNot('email', 'like', '%@fernhollow.test')
    expect(foreignEmails).toEqual([])
  })
})
