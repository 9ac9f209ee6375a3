// Booking throughput over HTTP (16 concurrent clients, non-conflicting slots) against the raw
// ceiling of the same database work done by a plain mysql2 loop with no app around it.
// Uses its own database (cuspline_bench) and the built app. Figures only, no assertions.
import { readFileSync } from 'node:fs'
import { Agent, request } from 'node:http'
import { performance } from 'node:perf_hooks'
import { DateTime } from 'luxon'
import type { Knex } from 'knex'
import mysql from 'mysql2/promise'
import { dbSettingsFromEnv } from '../../db/connection'
import { cpuSeconds, freshBenchDatabase, mondayAhead, percentile } from '../lib/bench'

const DATABASE = 'cuspline_bench'
const CLIENTS = 16
const BOOKINGS_PER_CLIENT = 40
const WARM_UP_PER_CLIENT = 5
const ZONE = 'America/Chicago'
const ALL_DAY = [{ start: '00:00', end: '24:00' }]
const FIRST_DAY = mondayAhead(4, ZONE) // bookings fill the days from here on, on the bench's own always-open site

const HOME_DATABASE = dbSettingsFromEnv().database // an existing database to connect to while creating ours
process.env.NUXT_DB_DATABASE = DATABASE
const { startAppServer } = await import('../lib/app-server')

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
    const [providerId] = await db('providers').insert({ user_id: userId, capabilities: '["restorative"]' })
    await db('shifts').insert({ provider_id: providerId, site_id: siteId, rrule: 'FREQ=DAILY', valid_from: '2026-01-01', local_start: '00:00', local_end: '24:00' })
    // With an e-mail address and consent, so each booking also queues its invitation and reminders.
    const [patientId] = await db('patients').insert({ first_name: 'Bench', last_name: `Lane ${lane}`, date_of_birth: '1980-01-01', email: `lane-${lane}@bench.test`, email_consent: true })
    lanes.push({ operatoryId: operatoryId as number, providerId: providerId as number, patientId: patientId as number })
  }
  return { siteId: siteId as number, lanes, adminId: admin.id as number }
}

function slot(lane: number, index: number): string {
  return DateTime.fromISO(`${FIRST_DAY}T00:00`, { zone: ZONE }).plus({ days: lane, hours: index * 2 }).toUTC().toISO()!
}

/** This checkout's own MariaDB (scripts/db-start.sh writes its pid file), not any other on the machine. */
function mariadbPid(): number {
  return Number(readFileSync(`${process.env.DATA_DIR ?? '.data'}/mariadb.pid`, 'utf8').trim())
}

/** Runs `work` and says how many CPU milliseconds per booking each process spent on it. */
async function withCpu<T extends object>(pids: Record<string, number>, bookings: number, work: () => Promise<T>) {
  const before = Object.fromEntries(Object.entries(pids).map(([name, pid]) => [name, cpuSeconds(pid)]))
  const result = await work()
  const cpuMsPerBooking = Object.fromEntries(Object.entries(pids).map(([name, pid]) => [name, ((cpuSeconds(pid) - before[name]!) * 1000) / bookings]))
  return { ...result, cpuMsPerBooking }
}

function cpuLine(cpu: Record<string, number>): string {
  return Object.entries(cpu).map(([name, ms]) => `${name} ${ms.toFixed(2)}`).join(', ')
}

type BenchSite = Awaited<ReturnType<typeof benchSite>>

async function signIn(baseURL: string): Promise<string> {
  const login = await fetch(`${baseURL}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'admin@fernhollow.test', password: 'cuspline-demo' }) })
  // Sign-in may first clear an older session cookie: keep the last one that carries a value.
  const cookies = login.headers.getSetCookie().map((line) => line.split(';')[0]!).filter((pair) => !pair.endsWith('='))
  if (login.status !== 200 || cookies.length === 0) throw new Error(`sign-in answered ${login.status} with no session cookie`)
  return cookies[cookies.length - 1]!
}

// node:http on kept-alive sockets: a lighter load generator than fetch, so more of the two cores
// go to the app and the database (the ceiling's client, plain mysql2, is light too).
const agent = new Agent({ keepAlive: true, maxSockets: CLIENTS })

function post(url: string, cookie: string, body: string): Promise<number> {
  return new Promise((done, fail) => {
    const sent = request(url, { method: 'POST', agent, headers: { cookie, 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) } }, (response) => {
      response.resume()
      response.on('end', () => done(response.statusCode ?? 0))
    })
    sent.on('error', fail)
    sent.end(body)
  })
}

function get(url: string, cookie: string): Promise<number> {
  return new Promise((done, fail) => {
    const sent = request(url, { agent, headers: { cookie } }, (response) => {
      response.resume()
      response.on('end', () => done(response.statusCode ?? 0))
    })
    sent.on('error', fail)
    sent.end()
  })
}

/** The floor under any API call: a signed-in GET /api/me (session unsealed, account checked, no booking work). */
async function signedInGets(baseURL: string, cookies: string[], perClient: number) {
  await Promise.all(cookies.map(async (cookie) => {
    for (let index = 0; index < perClient; index += 1) {
      const status = await get(`${baseURL}/api/me`, cookie)
      if (status !== 200) throw new Error(`GET /api/me answered ${status}, not 200`)
    }
  }))
  return {}
}

/** Each client books its own lane; slot numbers from `first` on, so warm-up and run never meet. */
async function httpRun(baseURL: string, site: BenchSite, cookies: string[], first: number, count: number) {
  const latencies: number[] = []
  const started = performance.now()
  let failures = 0
  await Promise.all(site.lanes.map(async (lane, laneIndex) => {
    for (let index = first; index < first + count; index += 1) {
      const begin = performance.now()
      const status = await post(`${baseURL}/api/visits`, cookies[laneIndex]!,
        JSON.stringify({ siteId: site.siteId, ...lane, startUtc: slot(laneIndex, index), items: [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }] }))
      if (status !== 201) failures += 1
      latencies.push(performance.now() - begin)
    }
  }))
  const seconds = (performance.now() - started) / 1000
  return { perSecond: latencies.length / seconds, p50: percentile(latencies, 0.5), p95: percentile(latencies, 0.95), failures }
}

/**
 * What the database alone can do: a plain mysql2 loop on one connection per client, each booking
 * locking the room and provider by writing, checking both for overlaps, inserting the visit and its
 * segments, and committing. No app, no pool, no query builder.
 */
async function rawCeiling(site: BenchSite, first: number, count: number) {
  const settings = dbSettingsFromEnv()
  const connections = await Promise.all(site.lanes.map(async () => {
    const connection = await mysql.createConnection({ host: settings.host, port: settings.port, user: settings.user, password: settings.password, database: DATABASE, timezone: 'Z' })
    await connection.query("SET time_zone = '+00:00'")
    await connection.query('SET SESSION TRANSACTION ISOLATION LEVEL READ COMMITTED')
    return connection
  }))
  const latencies: number[] = []
  const started = performance.now()
  await Promise.all(site.lanes.map(async (lane, laneIndex) => {
    const connection = connections[laneIndex]!
    for (let index = first; index < first + count; index += 1) {
      const begin = performance.now()
      const start = new Date(DateTime.fromISO(slot(laneIndex, index)).plus({ days: 40 }).toMillis())
      const handsOn = new Date(start.getTime() + 15 * 60_000)
      const end = new Date(start.getTime() + 65 * 60_000)
      await connection.query('BEGIN')
      await connection.query('UPDATE operatories SET booking_seq = booking_seq + 1 WHERE id = ?', [lane.operatoryId])
      await connection.query('UPDATE providers SET booking_seq = booking_seq + 1 WHERE id = ?', [lane.providerId])
      await connection.query('SELECT id FROM visit_segments WHERE operatory_id = ? AND start_utc < ? AND end_utc > ? LIMIT 1', [lane.operatoryId, end, start])
      await connection.query("SELECT id FROM visit_segments WHERE provider_id = ? AND kind = 'hands_on' AND start_utc < ? AND end_utc > ? LIMIT 1", [lane.providerId, end, handsOn])
      const [inserted] = await connection.query<mysql.ResultSetHeader>(
        'INSERT INTO visits (site_id, operatory_id, provider_id, patient_id, start_utc, end_utc, plan, ical_uid) VALUES (?, ?, ?, ?, ?, ?, ?, ?)',
        [site.siteId, lane.operatoryId, lane.providerId, lane.patientId, start, end, '{}', `raw-${laneIndex}-${index}@bench`],
      )
      await connection.query(
        'INSERT INTO visit_segments (visit_id, kind, label, operatory_id, provider_id, start_utc, end_utc) VALUES ?',
        [[
          [inserted.insertId, 'numbing', 'a', lane.operatoryId, lane.providerId, start, handsOn],
          [inserted.insertId, 'hands_on', 'b', lane.operatoryId, lane.providerId, handsOn, end],
        ]],
      )
      await connection.query('COMMIT')
      latencies.push(performance.now() - begin)
    }
  }))
  const seconds = (performance.now() - started) / 1000
  await Promise.all(connections.map((connection) => connection.end()))
  return { perSecond: latencies.length / seconds, p50: percentile(latencies, 0.5), p95: percentile(latencies, 0.95) }
}

const db = await freshBenchDatabase(DATABASE, { adminDatabase: HOME_DATABASE, poolMax: CLIENTS + 2 })
const site = await benchSite(db)
// BENCH_CPU_PROFILE=dir writes a V8 CPU profile of the app server there.
// The mail dispatcher is off: sending is background work, not part of booking (the ceiling sends none).
const server = await startAppServer({ NUXT_DB_DATABASE: DATABASE, NUXT_OUTBOX_DISPATCHER: 'false' }, process.env.BENCH_CPU_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_CPU_PROFILE}`] : [])
try {
  // One after another: sign-in counts attempts in flight per (account, address), and 16 at once would
  // look like a guessing run (429).
  const cookies: string[] = []
  for (const _lane of site.lanes) cookies.push(await signIn(server.url))
  // A few bookings first so both sides run warm (JIT, pools, buffer pool); these are not counted.
  await rawCeiling(site, 0, WARM_UP_PER_CLIENT)
  await httpRun(server.url, site, cookies, 0, WARM_UP_PER_CLIENT)
  const total = CLIENTS * BOOKINGS_PER_CLIENT
  const database = mariadbPid()
  const ceiling = await withCpu({ client: process.pid, database }, total, () => rawCeiling(site, WARM_UP_PER_CLIENT, BOOKINGS_PER_CLIENT))
  const http = await withCpu({ client: process.pid, app: server.pid, database }, total, () => httpRun(server.url, site, cookies, WARM_UP_PER_CLIENT, BOOKINGS_PER_CLIENT))
  await signedInGets(server.url, cookies, WARM_UP_PER_CLIENT)
  const floor = await withCpu({ app: server.pid }, total, () => signedInGets(server.url, cookies, BOOKINGS_PER_CLIENT))
  const fmt = (value: number) => value.toFixed(1)
  console.log(`booking throughput, ${CLIENTS} concurrent clients × ${BOOKINGS_PER_CLIENT} non-conflicting bookings (after ${WARM_UP_PER_CLIENT} warm-up each)`)
  console.log(`  raw mysql2 ceiling : ${fmt(ceiling.perSecond)} bookings/s  (p50 ${fmt(ceiling.p50)} ms, p95 ${fmt(ceiling.p95)} ms)`)
  console.log(`  HTTP through the app: ${fmt(http.perSecond)} bookings/s  (p50 ${fmt(http.p50)} ms, p95 ${fmt(http.p95)} ms, ${http.failures} not 201)`)
  console.log(`  app / ceiling       : ${fmt((http.perSecond / ceiling.perSecond) * 100)} %`)
  console.log(`  CPU ms per booking, ceiling: ${cpuLine(ceiling.cpuMsPerBooking)}`)
  console.log(`  CPU ms per booking, HTTP   : ${cpuLine(http.cpuMsPerBooking)}`)
  console.log(`  CPU ms per signed-in GET /api/me (the floor under any API call): ${cpuLine(floor.cpuMsPerBooking)}`)
} finally {
  await server.stop()
  await db.destroy()
}
