// The demo seeder (npm start) books a week back and a week ahead at every site through the real
// booking service, on a scratch database: the calendar it leaves is full, settled and never
// double-booked, and it interleaves numbing waits on one dentist's chairs.
import { execFile } from 'node:child_process'
import { promisify } from 'node:util'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Knex } from 'knex'
import { DateTime } from 'luxon'
import { createDb, dbSettingsFromEnv } from '../../db/connection'
import { migratorConfig } from '../../db/migration-source'
import { seedDemo } from '../../seeds/index'
import { closeTestDb, testDb } from '../helpers/db'
import { overlapCounts } from '../helpers/overlaps'

const SCRATCH = 'cuspline_demo_check'
const run = promisify(execFile)
let scratch: Knex
let seederOutput = ''

beforeAll(async () => {
  await testDb().raw(`DROP DATABASE IF EXISTS \`${SCRATCH}\``)
  await testDb().raw(`CREATE DATABASE \`${SCRATCH}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`)
  scratch = createDb({ ...dbSettingsFromEnv(), database: SCRATCH })
  await scratch.migrate.latest(migratorConfig)
  await seedDemo(scratch)
  const { stdout } = await run(process.execPath, ['--import', 'tsx', 'scripts/seed-demo-visits.ts'], {
    env: { ...process.env, NUXT_DB_DATABASE: SCRATCH, DB_NAME: SCRATCH }, timeout: 240_000,
  })
  seederOutput = stdout
}, 300_000)

afterAll(async () => {
  await scratch?.destroy()
  await testDb().raw(`DROP DATABASE IF EXISTS \`${SCRATCH}\``)
  await closeTestDb()
})

describe('demo visits', () => {
  it('fill a week back and a week ahead at every demo site', async () => {
    expect(seederOutput).toMatch(/booked \d+ demo visits through the booking service/)
    const sites = await scratch('sites').select('id', 'slug', 'time_zone')
    expect(sites.length).toBeGreaterThanOrEqual(3)
    for (const site of sites) {
      const starts: Date[] = await scratch('visits').where({ site_id: site.id }).pluck('start_utc')
      const today = DateTime.now().setZone(site.time_zone).toISODate()!
      const days = new Set(starts.map((start) => DateTime.fromJSDate(start, { zone: site.time_zone }).toISODate()!))
      const before = [...days].filter((day) => day < today)
      const after = [...days].filter((day) => day > today)
      // A week either side holds at least four working days each.
      expect(before.length, `${site.slug} days before today`).toBeGreaterThanOrEqual(4)
      expect(after.length, `${site.slug} days after today`).toBeGreaterThanOrEqual(4)
    }
  })

  it('leave past visits settled as a real week would: mostly finished, some missed or cancelled', async () => {
    const past = await scratch('visits').where('end_utc', '<=', new Date()).groupBy('state').select('state').count({ count: '*' }) as Array<{ state: string; count: number }>
    const byState: Record<string, number> = Object.fromEntries(past.map((row) => [row.state, Number(row.count)]))
    expect(byState.booked ?? 0).toBe(0)
    expect(byState.confirmed ?? 0).toBe(0)
    expect(byState.finished).toBeGreaterThan((byState.missed ?? 0) + (byState.cancelled ?? 0))
    expect((byState.missed ?? 0) + (byState.cancelled ?? 0)).toBeGreaterThan(0)
  })

  it('never double-book a chair or a provider\'s hands-on time', async () => {
    const overlaps = await overlapCounts(scratch)
    expect(overlaps.chairs).toBe(0)
    expect(overlaps.handsOn).toBe(0)
  })

  it('never put a hygienist at two cleanings at once: a cleaning is theirs from seating to dismissal (issue 13 §5)', async () => {
    // Outside room reset (no provider) no two cleanings of one hygienist overlap in different rooms.
    const [rows] = await scratch.raw(`SELECT COUNT(*) AS n FROM visit_segments x JOIN visit_segments y
      ON x.provider_id = y.provider_id AND x.visit_id < y.visit_id AND x.operatory_id <> y.operatory_id
      AND x.kind <> 'reset' AND y.kind <> 'reset' AND x.start_utc < y.end_utc AND x.end_utc > y.start_utc
      JOIN visits a ON a.id = x.visit_id JOIN visits b ON b.id = y.visit_id
      JOIN providers p ON p.id = x.provider_id JOIN users u ON u.id = p.user_id
      WHERE u.role = 'hygienist' AND a.plan LIKE '%"templateCode":"CLEAN-%' AND b.plan LIKE '%"templateCode":"CLEAN-%'`)
    expect(Number(rows[0].n)).toBe(0)
  })

  it('interleave one dentist\'s two chairs during numbing waits', async () => {
    const [rows] = await scratch.raw(`SELECT COUNT(*) AS n FROM visits a JOIN visits b
      ON a.provider_id = b.provider_id AND a.id < b.id AND a.operatory_id <> b.operatory_id
      AND a.start_utc < b.end_utc AND a.end_utc > b.start_utc
      JOIN visit_segments numbing ON numbing.visit_id = a.id AND numbing.kind = 'numbing'
      WHERE a.state NOT IN ('cancelled', 'missed') AND b.state NOT IN ('cancelled', 'missed')`)
    expect(Number(rows[0].n)).toBeGreaterThan(0)
  })

  it('leave one visit stranded by a chair block, so the Rebook list has something to show', async () => {
    expect(seederOutput).toMatch(/stranded 1 demo visit for the Rebook list/)
    const stranded = await scratch('visits').whereNotNull('stranded_reason').select('id', 'state', 'stranded_reason')
    expect(stranded).toHaveLength(1)
    expect(stranded[0].state).toBe('booked')
    expect(stranded[0].stranded_reason).toMatch(/is blocked: Handpiece repair/)
  })

  it('queue no patient mail for visits that began before the demo did', async () => {
    const queued = await scratch('outbox').join('visits', 'visits.id', 'outbox.visit_id')
      .where('outbox.state', 'queued').where('visits.start_utc', '<', new Date()).count({ count: '*' }).first()
    expect(Number(queued?.count)).toBe(0)
    const invitations = await scratch('outbox').where({ state: 'queued', kind: 'invitation' }).count({ count: '*' }).first()
    expect(Number(invitations?.count)).toBeGreaterThan(0)
  })
})
