// Range routes under the worst input they accept (issue 11 §2): the widest window, ending on the
// last allowed date (today + 3 years), every site, against shifts and blocks that repeat daily since
// the earliest allowed date (2000-01-01). Prints the app's CPU milliseconds per request (target
// ≤ 50 ms each) and the wall time, plus what a refused far-future query and a refused 20 MB body
// cost. Uses its own database (cuspline_bench_ranges) and the built app. Figures only, no assertions.
import { Agent, request } from 'node:http'
import { performance } from 'node:perf_hooks'
import type { Knex } from 'knex'
import { dbSettingsFromEnv } from '../../db/connection'
import { cpuSeconds, freshBenchDatabase, percentile } from '../lib/bench'
import { DATE_BOUNDS, latestAllowedDate, MAX_WINDOW_DAYS } from '../../shared/domain/input-bounds'
import { BALANCE_MAX_DAYS } from '../../shared/schemas/balance'
import { addDays } from '../../shared/utils/local-date'

const DATABASE = 'cuspline_bench_ranges'
const ROUNDS = 20
const WARM_UP = 3
const ROTA_VIEW_MAX_DAYS = 42 // server/services/rota-view-service.ts refuses to − from ≥ 42 days: 42 dates inclusive at most

const HOME_DATABASE = dbSettingsFromEnv().database // an existing database to connect to while creating ours
process.env.NUXT_DB_DATABASE = DATABASE
const { startAppServer } = await import('../lib/app-server')


/** The heaviest rota a caller could have stored: daily shifts and blocks since the earliest allowed date. */
async function heavyRota(db: Knex): Promise<void> {
  const providers = await db('providers').pluck('id')
  const sites = await db('sites').pluck('id')
  for (const siteId of sites) {
    for (const providerId of providers) {
      await db('shifts').insert({ provider_id: providerId, site_id: siteId, rrule: 'FREQ=DAILY', valid_from: DATE_BOUNDS.earliest, local_start: '06:00', local_end: '07:00' })
    }
    await db('blocks').insert({ site_id: siteId, start_date: DATE_BOUNDS.earliest, local_start: '12:00', local_end: '12:30', rrule: 'FREQ=DAILY', reason: 'Lunch' })
    for (const operatoryId of await db('operatories').where({ site_id: siteId }).pluck('id')) {
      await db('blocks').insert({ site_id: siteId, operatory_id: operatoryId, start_date: DATE_BOUNDS.earliest, local_start: '16:00', local_end: '16:15', rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', reason: 'Sterilise' })
    }
  }
}

const agent = new Agent({ keepAlive: true, maxSockets: 1 })

function send(url: string, cookie: string, method: string, body?: string, headers: Record<string, string | number> = {}): Promise<number> {
  return new Promise((resolve, reject) => {
    const sent = request(url, {
      method, agent,
      headers: { cookie, ...(body === undefined ? {} : { 'content-type': 'application/json', 'content-length': Buffer.byteLength(body) }), ...headers },
    }, (response) => {
      response.resume()
      response.on('end', () => resolve(response.statusCode ?? 0))
    })
    sent.on('error', reject)
    sent.end(body)
  })
}

async function signIn(baseURL: string): Promise<string> {
  const login = await fetch(`${baseURL}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'admin@fernhollow.test', password: 'cuspline-demo' }) })
  return login.headers.getSetCookie()[0]!.split(';')[0]!
}

const db = await freshBenchDatabase(DATABASE, { adminDatabase: HOME_DATABASE })
await heavyRota(db)
const siteId = (await db('sites').where({ slug: 'quarry-street' }).first('id')).id as number
const providerId = (await db('providers').first('id')).id as number
await db.destroy()

const server = await startAppServer({ NUXT_DB_DATABASE: DATABASE, NUXT_OUTBOX_DISPATCHER: 'false' })
try {
  const cookie = await signIn(server.url)
  const last = latestAllowedDate()
  const items = [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }]
  const cases: Array<{ name: string; method: string; path: string; body?: string; expect: number }> = [
    { name: `GET /api/rota, one site, ${ROTA_VIEW_MAX_DAYS} days to ${last}`, method: 'GET', path: `/api/rota?siteId=${siteId}&from=${addDays(last, -(ROTA_VIEW_MAX_DAYS - 1))}&to=${last}`, expect: 200 },
    { name: `GET /api/rota, one provider, ${ROTA_VIEW_MAX_DAYS} days to ${last}`, method: 'GET', path: `/api/rota?providerId=${providerId}&from=${addDays(last, -(ROTA_VIEW_MAX_DAYS - 1))}&to=${last}`, expect: 200 },
    { name: `GET /api/availability, ${MAX_WINDOW_DAYS} days to ${last}`, method: 'GET', path: `/api/availability?siteId=${siteId}&from=${addDays(last, -(MAX_WINDOW_DAYS - 1))}&to=${last}`, expect: 200 },
    { name: `POST /api/openings, all sites, ${MAX_WINDOW_DAYS} days to ${last}, limit 500`, method: 'POST', path: '/api/openings', body: JSON.stringify({ items, from: addDays(last, -(MAX_WINDOW_DAYS - 1)), to: last, limit: 500 }), expect: 200 },
    { name: `GET /api/balance, all sites, ${BALANCE_MAX_DAYS} days to ${last}`, method: 'GET', path: `/api/balance?from=${addDays(last, -(BALANCE_MAX_DAYS - 1))}&to=${last}`, expect: 200 },
    { name: 'GET /api/visits, one site, 43 days to the last allowed date', method: 'GET', path: `/api/visits?siteId=${siteId}&fromUtc=${addDays(last, -42)}T00:00:00Z&toUtc=${last}T23:59:59Z`, expect: 200 },
    { name: 'GET /api/rota, year 9999 (refused, 400)', method: 'GET', path: `/api/rota?siteId=${siteId}&from=9999-12-25&to=9999-12-31`, expect: 400 },
  ]

  console.log(`range routes, worst accepted input, ${ROUNDS} requests each after ${WARM_UP} to warm up (app CPU per request; target ≤ 50 ms)`)
  for (const item of cases) {
    const url = `${server.url}${item.path}`
    for (let round = 0; round < WARM_UP; round += 1) {
      const status = await send(url, cookie, item.method, item.body)
      if (status !== item.expect) throw new Error(`${item.name}: answered ${status}, expected ${item.expect}`)
    }
    const walls: number[] = []
    const cpuBefore = cpuSeconds(server.pid)
    for (let round = 0; round < ROUNDS; round += 1) {
      const started = performance.now()
      await send(url, cookie, item.method, item.body)
      walls.push(performance.now() - started)
    }
    const cpuMs = ((cpuSeconds(server.pid) - cpuBefore) * 1000) / ROUNDS
    console.log(`  ${item.name}: app CPU ${cpuMs.toFixed(1)} ms/request, wall median ${percentile(walls, 0.5).toFixed(1)} ms, p95 ${percentile(walls, 0.95).toFixed(1)} ms`)
  }

  // A 20 MB body, signed out: refused from its Content-Length before anything is read or parsed.
  const huge = Buffer.alloc(20 * 1024 * 1024, 0x20)
  const cpuBefore = cpuSeconds(server.pid)
  const walls: number[] = []
  for (let round = 0; round < 5; round += 1) {
    const started = performance.now()
    const status = await new Promise<number>((resolve) => {
      const sent = request(`${server.url}/api/patients`, { method: 'POST', headers: { 'content-type': 'application/json', 'content-length': huge.length } }, (response) => {
        response.resume()
        response.on('end', () => resolve(response.statusCode ?? 0))
      })
      sent.on('error', () => resolve(-1))
      sent.end(huge)
    })
    walls.push(performance.now() - started)
    if (status !== 413 && status !== -1) throw new Error(`20 MB body answered ${status}, expected 413`)
  }
  console.log(`  POST /api/patients with a 20 MB body, signed out (refused, 413): app CPU ${(((cpuSeconds(server.pid) - cpuBefore) * 1000) / 5).toFixed(1)} ms/request, wall median ${percentile(walls, 0.5).toFixed(1)} ms`)
} finally {
  agent.destroy()
  await server.stop()
}
