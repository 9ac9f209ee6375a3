// An always-open site for booking benchmarks in a database of its own choosing: one chair, one
// provider on shift around the clock and one patient per client, so concurrent clients never meet.
// Kept between runs; each run books on days after the last visit already there.
import type { Knex } from 'knex'
import { DateTime } from 'luxon'
import mysql from 'mysql2/promise'
import { dbSettingsFromEnv } from '../../db/connection'
import { earliestOverlappingStart } from '../../shared/domain/input-bounds'
import { cpuSeconds, mondayAhead, percentile } from './bench'
import { call } from './bench-http'

const ZONE = 'America/Chicago'
const ALL_DAY = [{ start: '00:00', end: '24:00' }]

export interface BenchAnnex {
  siteId: number
  lanes: Array<{ operatoryId: number; providerId: number; patientId: number }>
  /** The local day bookings of this run start on (later than every visit already at the annex). */
  firstDay: string
}

export async function benchAnnex(db: Knex, clients: number): Promise<BenchAnnex> {
  let site = await db('sites').where({ slug: 'bench-annex' }).first('id')
  if (!site) {
    const [siteId] = await db('sites').insert({
      name: 'Bench annex', slug: 'bench-annex', time_zone: ZONE, booking_unit_minutes: 5,
      opening_hours: JSON.stringify(Object.fromEntries([1, 2, 3, 4, 5, 6, 7].map((day) => [day, ALL_DAY]))),
      closed_dates: '[]', settings: JSON.stringify({ minimumNoticeMinutes: 0 }),
    })
    site = { id: siteId }
    const admins = await db('users').where({ role: 'admin', all_sites: true }).pluck('id')
    if (admins.length) await db('user_sites').insert(admins.map((userId) => ({ user_id: userId, site_id: siteId })))
  }
  const siteId = site.id as number
  const lanes = []
  for (let lane = 0; lane < clients; lane += 1) {
    let operatory = await db('operatories').where({ site_id: siteId, name: `Bench ${lane}` }).first('id')
    if (!operatory) [operatory] = (await db('operatories').insert({ site_id: siteId, name: `Bench ${lane}`, capabilities: '["restorative"]' })).map((id) => ({ id }))
    const email = `bench-${lane}@fernhollow.test`
    let provider = await db('providers').join('users', 'users.id', 'providers.user_id').where('users.email', email).first('providers.id')
    if (!provider) {
      const [userId] = await db('users').insert({ email, name: `Bench ${lane}`, role: 'dentist', password_hash: 'x' })
      const [providerId] = await db('providers').insert({ user_id: userId, capabilities: '["restorative"]' })
      await db('shifts').insert({ provider_id: providerId, site_id: siteId, rrule: 'FREQ=DAILY', valid_from: '2026-01-01', local_start: '00:00', local_end: '24:00' })
      provider = { id: providerId }
    }
    // With an e-mail address and consent, so each booking also queues its invitation and reminders.
    let patient = await db('patients').where({ email: `lane-${lane}@bench.test` }).first('id')
    if (!patient) [patient] = (await db('patients').insert({ first_name: 'Bench', last_name: `Lane ${lane}`, date_of_birth: '1980-01-01', email: `lane-${lane}@bench.test`, email_consent: true })).map((id) => ({ id }))
    lanes.push({ operatoryId: operatory.id as number, providerId: provider.id as number, patientId: patient.id as number })
  }
  const last = await db('visits').where({ site_id: siteId }).max({ end: 'end_utc' }).first()
  const after = last?.end ? DateTime.fromJSDate(last.end as Date, { zone: ZONE }).plus({ days: 1 }).toISODate()! : ''
  const earliest = mondayAhead(2, ZONE)
  return { siteId, lanes, firstDay: after > earliest ? after : earliest }
}

/** The `index`-th slot of a lane: two hours apart from the run's first day (each lane has its own chair, provider and patient). */
export function annexSlot(annex: BenchAnnex, _lane: number, index: number, dayOffset = 0): string {
  return DateTime.fromISO(`${annex.firstDay}T00:00`, { zone: ZONE }).plus({ days: dayOffset, hours: index * 2 }).toUTC().toISO()!
}

/** Each client books its own lane through POST /api/visits; slot numbers from `first` on. */
export async function httpBookings(baseURL: string, annex: BenchAnnex, cookies: string[], first: number, count: number) {
  const latencies: number[] = []
  const started = performance.now()
  let failures = 0
  await Promise.all(annex.lanes.map(async (lane, laneIndex) => {
    for (let index = first; index < first + count; index += 1) {
      const begin = performance.now()
      const answer = await call(`${baseURL}/api/visits`, { cookie: cookies[laneIndex % cookies.length]!, body: { siteId: annex.siteId, ...lane, startUtc: annexSlot(annex, laneIndex, index), items: [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }] } })
      if (answer.status !== 201) failures += 1
      latencies.push(performance.now() - begin)
    }
  }))
  const seconds = (performance.now() - started) / 1000
  return { perSecond: latencies.length / seconds, p50: percentile(latencies, 0.5), p95: percentile(latencies, 0.95), failures }
}

/**
 * What the database alone can do: a plain mysql2 loop on one connection per lane, each booking
 * locking the room and provider by writing, checking both for overlaps, inserting the visit and its
 * segments, and committing (five lane-days after the HTTP run's slots). The overlap checks carry the
 * same lower bound as the app's (earliestOverlappingStart). `connection` points it elsewhere (the cluster's write listener).
 */
export async function rawCeiling(annex: BenchAnnex, database: string, first: number, count: number, connection: { host?: string; port?: number; password?: string } = {}) {
  const settings = dbSettingsFromEnv()
  const connections = await Promise.all(annex.lanes.map(async () => {
    const opened = await mysql.createConnection({ host: connection.host ?? settings.host, port: connection.port ?? Number(settings.port), user: settings.user, password: connection.password ?? settings.password, database, timezone: 'Z' })
    await opened.query("SET time_zone = '+00:00'")
    await opened.query('SET SESSION TRANSACTION ISOLATION LEVEL READ COMMITTED')
    return opened
  }))
  const latencies: number[] = []
  const started = performance.now()
  await Promise.all(annex.lanes.map(async (lane, laneIndex) => {
    const link = connections[laneIndex]!
    for (let index = first; index < first + count; index += 1) {
      const begin = performance.now()
      const start = new Date(annexSlot(annex, laneIndex, index, 5))
      const handsOn = new Date(start.getTime() + 15 * 60_000)
      const end = new Date(start.getTime() + 65 * 60_000)
      await link.query('BEGIN')
      await link.query('UPDATE operatories SET booking_seq = booking_seq + 1 WHERE id = ?', [lane.operatoryId])
      await link.query('UPDATE providers SET booking_seq = booking_seq + 1 WHERE id = ?', [lane.providerId])
      await link.query('SELECT id FROM visit_segments WHERE operatory_id = ? AND start_utc < ? AND start_utc > ? AND end_utc > ? LIMIT 1', [lane.operatoryId, end, earliestOverlappingStart(start.getTime()), start])
      await link.query("SELECT id FROM visit_segments WHERE provider_id = ? AND kind = 'hands_on' AND start_utc < ? AND start_utc > ? AND end_utc > ? LIMIT 1", [lane.providerId, end, earliestOverlappingStart(handsOn.getTime()), handsOn])
      const [inserted] = await link.query<mysql.ResultSetHeader>(
        'INSERT INTO visits (site_id, operatory_id, provider_id, patient_id, start_utc, end_utc, plan, ical_uid) VALUES (?, ?, ?, ?, ?, ?, ?, ?)',
        [annex.siteId, lane.operatoryId, lane.providerId, lane.patientId, start, end, '{}', `raw-${start.getTime()}-${laneIndex}@bench`],
      )
      await link.query(
        'INSERT INTO visit_segments (visit_id, kind, label, operatory_id, provider_id, start_utc, end_utc) VALUES ?',
        [[
          [inserted.insertId, 'numbing', 'a', lane.operatoryId, lane.providerId, start, handsOn],
          [inserted.insertId, 'hands_on', 'b', lane.operatoryId, lane.providerId, handsOn, end],
        ]],
      )
      await link.query('COMMIT')
      latencies.push(performance.now() - begin)
    }
  }))
  const seconds = (performance.now() - started) / 1000
  await Promise.all(connections.map((opened) => opened.end()))
  return { perSecond: latencies.length / seconds, p50: percentile(latencies, 0.5), p95: percentile(latencies, 0.95) }
}

/** Runs `work` and says how many CPU milliseconds per operation each process spent on it. */
export async function withCpu<T extends object>(pids: Record<string, number>, operations: number, work: () => Promise<T>) {
  const before = Object.fromEntries(Object.entries(pids).map(([name, pid]) => [name, cpuSeconds(pid)]))
  const result = await work()
  const cpuMs = Object.fromEntries(Object.entries(pids).map(([name, pid]) => [name, ((cpuSeconds(pid) - before[name]!) * 1000) / operations]))
  return { ...result, cpuMs }
}

export function cpuLine(cpu: Record<string, number>): string {
  return Object.entries(cpu).map(([name, ms]) => `${name} ${ms.toFixed(2)}`).join(', ')
}
