// Group scale (issue 19 §3): 60 sites, 400 chairs, 250 providers and 500,000 visits over a year
// (scripts/lib/group-scale.ts, its own database, built once). Prints median and p95 of:
//   openings for a 2-surface filling across 5 sites of one region, first 10 and all over 30 days,
//     in the engine (the brute-force reference beside it) and through POST /api/openings;
//   the Chairboard day (GET /api/visits for one site's day) and Balance (one site-month, all sites a week);
//   booking over HTTP with 16 clients beside the raw mysql2 ceiling, and the app's CPU per booking as a
//     multiple of the signed-in floor (GET /api/me) measured in the same run.
// Figures only, no assertions. BENCH_CPU_PROFILE=dir writes a V8 CPU profile of the app server there;
// GROUP_BENCH_PARTS=engine,api,booking (default all) runs only those parts.
import { readFileSync } from 'node:fs'
import { performance } from 'node:perf_hooks'
import type { Knex } from 'knex'
import { DateTime } from 'luxon'
import { dbSettingsFromEnv } from '../../db/connection'
import { findOpenings } from '../../shared/domain/openings'
import { expandAvailabilityMs } from '../../shared/domain/rota'
import { planVisit } from '../../shared/domain/chair-time'
import { localDayRange } from '../../shared/utils/local-date'
import type { BookingUnitMinutes } from '../../shared/types/chair-time'
import type { Opening, OpeningsQuery, OpeningsSite } from '../../shared/types/openings'
import type { OpeningHours } from '../../shared/types/rota'
import { busySegments, providersByIds } from '../../server/repositories/openings-inputs'
import { findCurrentTemplateByCode } from '../../server/repositories/templates'
import { bruteForceOpenings } from '../../tests/support/openings-brute-force'
import { percentile } from '../lib/bench'
import { call, signIn, timeRequests, timingLine } from '../lib/bench-http'
import { benchAnnex, cpuLine, httpBookings, rawCeiling, withCpu } from '../lib/bench-annex'
import { GROUP, GROUP_ADMIN, groupScaleDatabase } from '../lib/group-scale'
import { startAppServer } from '../lib/app-server'

const CLIENTS = 16
const BOOKINGS_PER_CLIENT = 40
const WARM_UP_PER_CLIENT = 5
const ENGINE_RUNS = 30
const API_RUNS = 30
const DAYS = 30
const HOME_DATABASE = dbSettingsFromEnv().database
const fmt = (value: number) => value.toFixed(1)
const fmt2 = (value: number) => value.toFixed(2)
const PARTS = new Set((process.env.GROUP_BENCH_PARTS ?? 'engine,api,booking').split(',').map((part) => part.trim()))

const group = await groupScaleDatabase({ adminDatabase: HOME_DATABASE, poolMax: CLIENTS + 2 })
const { db } = group
const counts = await db('visits').count({ visits: '*' }).first()
console.log(`Group scale (${group.database}): ${group.sites.length} sites, ${GROUP.chairs} chairs, ${GROUP.providers} providers, ${Number(counts?.visits ?? 0).toLocaleString('en-US')} visits from ${group.firstDay} (${group.built === 'reused' ? 'reused' : `built in ${group.built.seconds.toFixed(0)} s`})`)
console.log('  machine shared: load average at start', readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' '))

// ------------------------------------------------------------ openings in the engine
// The 5 sites of the first region (the data model has no distances: a region's sites stand for the
// nearest five), searched as the openings service searches them: one site at a time with its own
// plan (units differ), then the earliest across them.
const region = group.sites.filter((site) => site.region === 0).slice(0, 5)
const zone = region[0]!.zone
const from = DateTime.now().setZone(zone).plus({ days: 1 }).toISODate()!
const to = DateTime.fromISO(from).plus({ days: DAYS - 1 }).toISODate()!
if (PARTS.has('engine')) {
  const filling = (await findCurrentTemplateByCode(db, 'COMP-POST'))!
  const perSite: Array<{ first10: OpeningsQuery; all: OpeningsQuery }> = []
  const json = <T>(value: unknown): T => (typeof value === 'string' ? JSON.parse(value) : value) as T

  /** A site's calendar rows as the server's site-calendar repository reads them (its #shared imports do not load under tsx). */
  async function loadSiteCalendar(db: Knex, siteId: number) {
    const site = await db('sites').where({ id: siteId }).first()
    const [operatories, shifts, exceptions, blocks] = await Promise.all([
      db('operatories').where({ site_id: siteId }).orderBy(['sort_order', 'id']),
      db('shifts').where({ site_id: siteId }),
      db('shift_exceptions').where((where) => where.where({ site_id: siteId }).orWhereNull('site_id')),
      db('blocks').where({ site_id: siteId }),
    ])
    return {
      site: { id: site.id as number, timeZone: site.time_zone as string, openingHours: json<OpeningHours>(site.opening_hours), closedDates: json<string[]>(site.closed_dates) },
      bookingUnitMinutes: site.booking_unit_minutes as number,
      operatories: operatories.map((row) => ({ id: row.id, siteId: row.site_id, active: Boolean(row.active) })),
      operatoryDetails: operatories.map((row) => ({ id: row.id as number, capabilities: json<string[]>(row.capabilities), active: Boolean(row.active) })),
      shifts: shifts.map((row) => ({ id: row.id, providerId: row.provider_id as number, siteId: row.site_id, rrule: row.rrule, startDate: row.valid_from, untilDate: row.valid_until, localStart: row.local_start, localEnd: row.local_end })),
      exceptions: exceptions.map((row) => ({ id: row.id, providerId: row.provider_id, kind: row.kind, siteId: row.site_id, startDate: row.start_date, endDate: row.end_date, localStart: row.local_start, localEnd: row.local_end, reason: row.reason })),
      blocks: blocks.map((row) => ({ id: row.id, siteId: row.site_id, operatoryId: row.operatory_id, providerId: row.provider_id, date: row.start_date, localStart: row.local_start, localEnd: row.local_end, rrule: row.rrule, untilDate: row.until_date, reason: row.reason })),
    }
  }
  for (const site of region) {
    const calendar = await loadSiteCalendar(db, site.id)
    const fromMs = Date.parse(localDayRange(from, calendar.site.timeZone).fromUtc)
    const toMs = Date.parse(localDayRange(to, calendar.site.timeZone).toUtc)
    const providerIds = [...new Set(calendar.shifts.map((shift) => shift.providerId))]
    const providers = await providersByIds(db, providerIds)
    const openingsSite: OpeningsSite = {
      id: site.id, timeZone: calendar.site.timeZone, bookingUnitMinutes: calendar.bookingUnitMinutes as BookingUnitMinutes,
      operatories: calendar.operatoryDetails.map((room) => ({ id: room.id, siteId: site.id, active: room.active, capabilities: room.capabilities })),
      providers: providers.map((provider) => ({ id: provider.id, categories: provider.categories })),
      availability: expandAvailabilityMs({ ...calendar, fromUtc: new Date(fromMs).toISOString(), toUtc: new Date(toMs + 86_400_000).toISOString() }),
    }
    const busy = await busySegments(db, openingsSite.operatories.map((room) => room.id), providerIds, fromMs, toMs + 86_400_000)
    const plan = planVisit([{ template: filling, tooth: '19', surfaces: 'MO' }], { unitMinutes: openingsSite.bookingUnitMinutes })
    const first10: OpeningsQuery = { plan, capability: filling.capability, category: filling.category, sites: [openingsSite], busy, fromMs, toMs, nowMs: fromMs, minimumNoticeMinutes: 0, limit: 10 }
    perSite.push({ first10, all: { ...first10, limit: 1_000_000 } })
  }
  const earliest = (lists: Opening[][], limit: number) => lists.flat().sort((a, b) => a.startMs - b.startMs || a.siteId - b.siteId).slice(0, limit)
  const engineFirst10 = () => earliest(perSite.map((site) => findOpenings(site.first10).openings), 10)
  const engineAll = () => earliest(perSite.map((site) => findOpenings(site.all).openings), Infinity)
  const bruteFirst10 = () => earliest(perSite.map((site) => bruteForceOpenings(site.first10)), 10)
  const bruteAll = () => earliest(perSite.map((site) => bruteForceOpenings(site.all)), Infinity)

  function measure(runs: number, run: () => unknown) {
    const times: number[] = []
    for (let index = 0; index < runs; index += 1) {
      const t0 = performance.now()
      run()
      times.push(performance.now() - t0)
    }
    return { median: percentile(times, 0.5), p95: percentile(times, 0.95) }
  }
  for (let index = 0; index < 3; index += 1) engineAll() // warm-up
  const allCount = engineAll().length
  const e10 = measure(ENGINE_RUNS, engineFirst10)
  const eAll = measure(ENGINE_RUNS, engineAll)
  const b10 = measure(5, bruteFirst10)
  const bAll = measure(2, bruteAll)
  const key = (o: Opening) => `${o.siteId}/${o.operatoryId}/${o.providerId}@${o.startMs}`
  const same = engineAll().map(key).join() === bruteAll().map(key).join()
  const busyCount = perSite.reduce((sum, site) => sum + site.first10.busy.length, 0)
  console.log(`Openings, 2-surface filling (tooth 19 MO), 5 sites of one region, ${from}..${to} (${busyCount.toLocaleString('en-US')} booked segments in range)`)
  console.log(`  engine, first 10      : median ${e10.median.toFixed(2)} ms, p95 ${e10.p95.toFixed(2)} ms (target ≤ 20 ms median)`)
  console.log(`  engine, all ${allCount}      : median ${eAll.median.toFixed(2)} ms, p95 ${eAll.p95.toFixed(2)} ms`)
  console.log(`  brute force, first 10 : median ${fmt(b10.median)} ms; all: median ${fmt(bAll.median)} ms`)
  console.log(`  brute force / engine  : ×${(b10.median / e10.median).toFixed(0)} (first 10), ×${(bAll.median / eAll.median).toFixed(0)} (all); same openings: ${same ? 'yes' : 'NO'}`)
}

// ------------------------------------------------------------ the APIs
const annex = await benchAnnex(db, CLIENTS)
const server = await startAppServer({ NUXT_DB_DATABASE: group.database, NUXT_OUTBOX_DISPATCHER: 'false' }, process.env.BENCH_CPU_PROFILE ? ['--cpu-prof', `--cpu-prof-dir=${process.env.BENCH_CPU_PROFILE}`] : [])
try {
  const cookie = await signIn(server.url, GROUP_ADMIN.email, GROUP_ADMIN.password)
  const openingsBody = (limit: number) => ({ items: [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }], siteIds: region.map((site) => site.id), from, to, limit })
  const appPid = server.pid
  if (PARTS.has('api')) {
    const api10 = await timeRequests(API_RUNS, 5, () => call(`${server.url}/api/openings`, { cookie, body: openingsBody(10) }), { appPid })
    const apiAll = await timeRequests(API_RUNS, 3, () => call(`${server.url}/api/openings`, { cookie, body: openingsBody(500) }), { appPid })
    console.log('POST /api/openings, same search through the app (plan, calendars, busy segments from MariaDB, engine, JSON)')
    console.log(`  first 10            : ${timingLine(api10)}`)
    console.log(`  all (limit 500)     : ${timingLine(apiAll)}`)

    // The Chairboard's day: the busiest site's next weekday.
    const boardSite = group.sites[0]!
    const boardDay = DateTime.now().setZone(boardSite.zone).plus({ days: 1 })
    const day = (boardDay.weekday > 5 ? boardDay.plus({ days: 8 - boardDay.weekday }) : boardDay).toISODate()!
    const dayRange = localDayRange(day, boardSite.zone)
    const dayVisits = JSON.parse((await call(`${server.url}/api/visits?siteId=${boardSite.id}&fromUtc=${encodeURIComponent(dayRange.fromUtc)}&toUtc=${encodeURIComponent(dayRange.toUtc)}`, { cookie })).body) as unknown[]
    const board = await timeRequests(API_RUNS * 2, 5, () => call(`${server.url}/api/visits?siteId=${boardSite.id}&fromUtc=${encodeURIComponent(dayRange.fromUtc)}&toUtc=${encodeURIComponent(dayRange.toUtc)}`, { cookie }), { appPid })
    console.log(`Chairboard day, GET /api/visits, one site (${dayVisits.length} visits on ${day}): ${timingLine(board)} (target ≤ 30 ms)`)

    const monthStart = DateTime.now().setZone(boardSite.zone).plus({ months: 1 }).startOf('month')
    const monthQuery = `from=${monthStart.toISODate()}&to=${monthStart.endOf('month').toISODate()}&siteId=${boardSite.id}`
    const weekStart = DateTime.now().setZone(boardSite.zone).plus({ weeks: 1 }).startOf('week')
    const weekQuery = `from=${weekStart.toISODate()}&to=${weekStart.plus({ days: 6 }).toISODate()}`
    const balanceMonth = await timeRequests(API_RUNS, 3, () => call(`${server.url}/api/balance?${monthQuery}`, { cookie }), { appPid })
    const balanceWeek = await timeRequests(API_RUNS / 2, 2, () => call(`${server.url}/api/balance?${weekQuery}`, { cookie }), { appPid })
    console.log(`Balance, GET /api/balance (target ≤ 300 ms)`)
    console.log(`  one site, ${monthStart.toFormat('yyyy-MM')}   : ${timingLine(balanceMonth)}`)
    console.log(`  all ${group.sites.length + 1} sites, a week : ${timingLine(balanceWeek)}`)
  }

  // ---------------------------------------------------------- booking at group scale
  if (PARTS.has('booking')) {
    const cookies: string[] = []
    for (let client = 0; client < CLIENTS; client += 1) cookies.push(await signIn(server.url, GROUP_ADMIN.email, GROUP_ADMIN.password))
    await rawCeiling(annex, group.database, 0, WARM_UP_PER_CLIENT)
    await httpBookings(server.url, annex, cookies, 0, WARM_UP_PER_CLIENT)
    const total = CLIENTS * BOOKINGS_PER_CLIENT
    const database = Number(readFileSync(`${process.env.DATA_DIR ?? '.data'}/mariadb.pid`, 'utf8').trim())
    const ceiling = await withCpu({ client: process.pid, database }, total, () => rawCeiling(annex, group.database, WARM_UP_PER_CLIENT, BOOKINGS_PER_CLIENT))
    const http = await withCpu({ client: process.pid, app: appPid, database }, total, () => httpBookings(server.url, annex, cookies, WARM_UP_PER_CLIENT, BOOKINGS_PER_CLIENT))
    const me = () => Promise.all(cookies.map(async (client) => {
      for (let index = 0; index < BOOKINGS_PER_CLIENT; index += 1) {
        const answer = await call(`${server.url}/api/me`, { cookie: client })
        if (answer.status !== 200) throw new Error(`GET /api/me answered ${answer.status}`)
      }
      return {}
    })).then(() => ({}))
    await me()
    // The floor moves with the shared machine (1.0 to 1.7 ms between runs here): measured three
    // times, the median is the divisor and the range is printed beside it.
    const floors: number[] = []
    for (let round = 0; round < 3; round += 1) floors.push((await withCpu({ app: appPid }, total, me)).cpuMs.app!)
    const floor = { cpuMs: { app: percentile(floors, 0.5) } }
    console.log(`Booking at group scale, one app process, single MariaDB: ${CLIENTS} clients × ${BOOKINGS_PER_CLIENT} non-conflicting bookings (after ${WARM_UP_PER_CLIENT} warm-up each)`)
    console.log(`  raw mysql2 ceiling  : ${fmt(ceiling.perSecond)} bookings/s (p50 ${fmt(ceiling.p50)} ms, p95 ${fmt(ceiling.p95)} ms)`)
    console.log(`  HTTP through the app: ${fmt(http.perSecond)} bookings/s (p50 ${fmt(http.p50)} ms, p95 ${fmt(http.p95)} ms, ${http.failures} not 201)`)
    console.log(`  app / ceiling       : ${fmt((http.perSecond / ceiling.perSecond) * 100)} %`)
    console.log(`  CPU ms per booking, ceiling: ${cpuLine(ceiling.cpuMs)}`)
    console.log(`  CPU ms per booking, HTTP   : ${cpuLine(http.cpuMs)}`)
    console.log(`  CPU ms per signed-in GET /api/me (the floor): ${cpuLine(floor.cpuMs)} (median of 3; ${fmt2(Math.min(...floors))} to ${fmt2(Math.max(...floors))})`)
    console.log(`  app CPU per booking / floor: ×${(http.cpuMs.app! / floor.cpuMs.app!).toFixed(1)} (target ≤ 2.5)`)
  }
  console.log('  machine shared: load average at end', readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' '))
} finally {
  await server.stop()
  await db.destroy()
}
