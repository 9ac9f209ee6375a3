// Booking throughput over HTTP (16 concurrent clients, non-conflicting slots) against the raw
// ceiling of the same database work done by a plain mysql2 loop with no app around it.
// Uses its own database (cuspline_bench) and the built app. Figures only, no assertions.
import { performance } from 'node:perf_hooks'
import { DateTime } from 'luxon'
import type { Knex } from 'knex'
import { createDb, dbSettingsFromEnv } from '../../db/connection'
import { migratorConfig } from '../../db/migration-source'
import { seedDemo } from '../../seeds/index'

const DATABASE = 'cuspline_bench'
const CLIENTS = 16
const BOOKINGS_PER_CLIENT = 25
const ZONE = 'America/Chicago'
const ALL_DAY = [{ start: '00:00', end: '24:00' }]

process.env.NUXT_DB_DATABASE = DATABASE
const { startAppServer } = await import('../lib/app-server')

function percentile(values: number[], share: number): number {
  const sorted = [...values].sort((a, b) => a - b)
  return sorted[Math.min(sorted.length - 1, Math.floor(share * sorted.length))]!
}

async function freshDatabase(): Promise<Knex> {
  const admin = createDb({ ...dbSettingsFromEnv(), database: 'cuspline' })
  await admin.raw(`DROP DATABASE IF EXISTS \`${DATABASE}\``)
  await admin.raw(`CREATE DATABASE \`${DATABASE}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`)
  await admin.destroy()
  const db = createDb({ ...dbSettingsFromEnv(), database: DATABASE, poolMax: CLIENTS + 2 })
  await db.migrate.latest(migratorConfig)
  await seedDemo(db)
  return db
}

/** One always-open site with a room, a provider on shift around the clock and patients per client. */
async function benchSite(db: Knex) {
  const [siteId] = await db('sites').insert({
    name: 'Bench annex', slug: 'bench-annex', time_zone: ZONE, booking_unit_minutes: 5,
    opening_hours: JSON.stringify(Object.fromEntries([1, 2, 3, 4, 5, 6, 7].map((day) => [day, ALL_DAY]))),
    closed_dates: '[]', settings: JSON.stringify({ minimumNoticeMinutes: 0 }),
  })
  const lanes = []
  const admin = await db('users').where({ email: 'admin@fernhollow.test' }).first('id')
  for (let lane = 0; lane < CLIENTS; lane += 1) {
    const [operatoryId] = await db('operatories').insert({ site_id: siteId, name: `Bench ${lane}`, capabilities: '["restorative"]' })
    const [userId] = await db('users').insert({ email: `bench-${lane}@fernhollow.test`, name: `Bench ${lane}`, role: 'dentist', password_hash: 'x' })
    const [providerId] = await db('providers').insert({ user_id: userId, kind: 'dentist', capabilities: '["restorative"]' })
    await db('shifts').insert({ provider_id: providerId, site_id: siteId, rrule: 'FREQ=DAILY', valid_from: '2026-01-01', local_start: '00:00', local_end: '24:00' })
    const [patientId] = await db('patients').insert({ first_name: 'Bench', last_name: `Lane ${lane}`, date_of_birth: '1980-01-01' })
    lanes.push({ operatoryId: operatoryId as number, providerId: providerId as number, patientId: patientId as number })
  }
  return { siteId: siteId as number, lanes, adminId: admin.id as number }
}

function slot(lane: number, index: number): string {
  return DateTime.fromISO('2027-06-01T00:00', { zone: ZONE }).plus({ days: lane, hours: index * 2 }).toUTC().toISO()!
}

async function httpRun(baseURL: string, site: Awaited<ReturnType<typeof benchSite>>) {
  const latencies: number[] = []
  const started = performance.now()
  let failures = 0
  await Promise.all(site.lanes.map(async (lane, laneIndex) => {
    const login = await fetch(`${baseURL}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'admin@fernhollow.test', password: 'cuspline-demo' }) })
    const cookie = login.headers.getSetCookie()[0]!.split(';')[0]!
    for (let index = 0; index < BOOKINGS_PER_CLIENT; index += 1) {
      const begin = performance.now()
      const response = await fetch(`${baseURL}/api/appointments`, {
        method: 'POST', headers: { cookie, 'content-type': 'application/json' },
        body: JSON.stringify({ siteId: site.siteId, ...lane, startUtc: slot(laneIndex, index), items: [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }] }),
      })
      await response.arrayBuffer()
      if (response.status !== 201) failures += 1
      latencies.push(performance.now() - begin)
    }
  }))
  const seconds = (performance.now() - started) / 1000
  return { perSecond: latencies.length / seconds, p50: percentile(latencies, 0.5), p95: percentile(latencies, 0.95), failures }
}

/** The same locks, overlap checks and inserts in a plain loop: what the database alone can do. */
async function rawCeiling(db: Knex, site: Awaited<ReturnType<typeof benchSite>>) {
  const latencies: number[] = []
  const started = performance.now()
  await Promise.all(site.lanes.map(async (lane, laneIndex) => {
    for (let index = 0; index < BOOKINGS_PER_CLIENT; index += 1) {
      const begin = performance.now()
      const start = new Date(DateTime.fromISO(slot(laneIndex, index)).plus({ days: 40 }).toMillis())
      const end = new Date(start.getTime() + 65 * 60_000)
      await db.transaction(async (trx) => {
        await trx('operatories').where({ id: lane.operatoryId }).increment('booking_seq', 1)
        await trx('providers').where({ id: lane.providerId }).increment('booking_seq', 1)
        await trx('appointment_segments').where({ operatory_id: lane.operatoryId }).where('start_utc', '<', end).where('end_utc', '>', start).first('id')
        await trx('appointment_segments').where({ provider_id: lane.providerId, kind: 'hands_on' }).where('start_utc', '<', end).where('end_utc', '>', start).first('id')
        const [id] = await trx('appointments').insert({
          site_id: site.siteId, operatory_id: lane.operatoryId, provider_id: lane.providerId, patient_id: lane.patientId,
          start_utc: start, end_utc: end, plan: '{}', ical_uid: `raw-${laneIndex}-${index}@bench`,
        })
        await trx('appointment_segments').insert([
          { appointment_id: id, kind: 'assist', label: 'a', operatory_id: lane.operatoryId, provider_id: lane.providerId, start_utc: start, end_utc: new Date(start.getTime() + 5 * 60_000) },
          { appointment_id: id, kind: 'hands_on', label: 'b', operatory_id: lane.operatoryId, provider_id: lane.providerId, start_utc: new Date(start.getTime() + 5 * 60_000), end_utc: end },
        ])
      }, { isolationLevel: 'read committed' })
      latencies.push(performance.now() - begin)
    }
  }))
  const seconds = (performance.now() - started) / 1000
  return { perSecond: latencies.length / seconds, p50: percentile(latencies, 0.5), p95: percentile(latencies, 0.95) }
}

const db = await freshDatabase()
const site = await benchSite(db)
// BENCH_CPU_PROFILE=dir writes a V8 CPU profile of the app server there.
const server = await startAppServer({ NUXT_DB_DATABASE: DATABASE }, process.env.BENCH_CPU_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_CPU_PROFILE}`] : [])
try {
  const ceiling = await rawCeiling(db, site)
  const http = await httpRun(server.url, site)
  const fmt = (value: number) => value.toFixed(1)
  console.log(`booking throughput, ${CLIENTS} concurrent clients × ${BOOKINGS_PER_CLIENT} non-conflicting bookings`)
  console.log(`  raw mysql2 ceiling : ${fmt(ceiling.perSecond)} bookings/s  (p50 ${fmt(ceiling.p50)} ms, p95 ${fmt(ceiling.p95)} ms)`)
  console.log(`  HTTP through the app: ${fmt(http.perSecond)} bookings/s  (p50 ${fmt(http.p50)} ms, p95 ${fmt(http.p95)} ms, ${http.failures} not 201)`)
  console.log(`  app / ceiling       : ${fmt((http.perSecond / ceiling.perSecond) * 100)} %`)
} finally {
  await server.stop()
  await db.destroy()
}
