// Migrations run up and down cleanly, and the demo seed is deterministic, on a scratch database.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Knex } from 'knex'
import mysql from 'mysql2/promise'
import { createDb, dbSettingsFromEnv } from '../../db/connection'
import { migratorConfig } from '../../db/migration-source'
import { seedDemo } from '../../seeds/index'
import { closeTestDb, testDb } from '../helpers/db'

const SCRATCH = 'cuspline_migration_check'
let scratch: Knex

/** Host, port, user and password for a plain mysql2 connection outside the app's settings. */
function rawSettings() {
  const { host, port, user, password } = dbSettingsFromEnv()
  return { host, port, user, password }
}

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
      'audit_log', 'blocks', 'idempotency_keys', 'inbound_mail', 'move_offers', 'offers', 'operatories', 'outbox', 'patient_import_mappings', 'patient_imports', 'patient_merges', 'patient_recall_intervals', 'patients', 'procedure_templates',
      'providers', 'recalls', 'shift_exceptions', 'shifts', 'sign_in_attempts', 'sites', 'sms_replies', 'user_sites', 'users',
      'visit_segments', 'visits', 'waitlist_entries',
    ])
    await scratch.migrate.rollback(migratorConfig, true)
    expect(await tableNames(scratch)).toEqual([])
    await scratch.migrate.latest(migratorConfig)
    expect((await tableNames(scratch)).length).toBe(26)
  })

  it('renames appointments to visits, carrying rows written before the rename', async () => {
    const rename = { ...migratorConfig, name: '20261204090100_rename-appointments-to-visits.ts' }
    await scratch.migrate.down(rename)
    expect(await tableNames(scratch)).toContain('appointments')
    await scratch('audit_log').insert({ action: 'visit_booked', entity: 'appointment', entity_id: '7', after: '{"appointmentId":7,"state":"booked"}' })
    await scratch('outbox').insert({ kind: 'invitation', appointment_id: null, payload: '{"appointmentId":7}', due_at: new Date() })
    await scratch.migrate.up(rename)
    const asJson = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : value)
    const audit = await scratch('audit_log').where({ entity_id: '7' }).first('entity', 'after')
    expect({ entity: audit.entity, after: asJson(audit.after) }).toEqual({ entity: 'visit', after: { visitId: 7, state: 'booked' } })
    expect(asJson((await scratch('outbox').first('payload', 'visit_id')).payload)).toEqual({ visitId: 7 })
    expect(await tableNames(scratch)).not.toContain('appointments')
    await scratch('audit_log').delete()
    await scratch('outbox').delete()
  })

  it('stores DATETIME values as UTC whatever the session zone was', async () => {
    // Written through the app's own connection settings (db/connection.ts): a JS Date and a NOW(3) default.
    await scratch.schema.dropTableIfExists('datetime_check')
    await scratch.schema.createTable('datetime_check', (t) => {
      t.integer('id').primary()
      t.datetime('at', { precision: 3 })
      t.datetime('made', { precision: 3 }).notNullable().defaultTo(scratch.fn.now(3))
    })
    try {
      const instant = new Date(Date.UTC(2026, 6, 1, 12, 34, 56, 789)) // summer: 05:34 in Los Angeles, 21:34 in Tokyo
      await scratch('datetime_check').insert({ id: 1, at: instant })
      // Read back raw, as strings, on a plain connection whose session zone is deliberately not UTC.
      const raw = await mysql.createConnection({ ...rawSettings(), database: SCRATCH, dateStrings: true, timezone: '+09:00' })
      try {
        await raw.query("SET time_zone = '+09:00'")
        const [rows] = await raw.query('SELECT at, made, TIMESTAMPDIFF(MINUTE, made, UTC_TIMESTAMP(3)) AS behind_utc, TIMESTAMPDIFF(MINUTE, made, NOW(3)) AS behind_session FROM datetime_check WHERE id = 1')
        const row = (rows as Array<{ at: string; made: string; behind_utc: number; behind_session: number }>)[0]!
        expect(row.at).toBe('2026-07-01 12:34:56.789')
        // NOW(3) on the app's connection wrote UTC wall time: minutes behind UTC_TIMESTAMP, nine hours behind +09:00.
        expect(row.behind_utc).toBeGreaterThanOrEqual(0)
        expect(row.behind_utc).toBeLessThan(60)
        expect(row.behind_session).toBeGreaterThanOrEqual(9 * 60)
      } finally {
        await raw.end()
      }
      // And it reads back through the app's connection as the same instant.
      expect((await scratch('datetime_check').where({ id: 1 }).first('at')).at.toISOString()).toBe(instant.toISOString())
    } finally {
      await scratch.schema.dropTableIfExists('datetime_check')
    }
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
    // A provider's kind is its account's role (migration 20261203120100).
    const providers = await db('providers').join('users', 'users.id', 'providers.user_id').groupBy('users.role').orderBy('users.role').select('users.role').count({ count: '*' })
    expect(providers.map((row) => [(row as { role: string }).role, Number(row.count)])).toEqual([['dentist', 4], ['hygienist', 3]])
    const patients = await db('patients').count({ count: '*' }).first()
    expect(Number(patients!.count)).toBe(300)
    const foreignEmails = await db('patients').whereNotNull('email').whereNot('email', 'like', '%@fernhollow.test')
    expect(foreignEmails).toEqual([])
  })
})
