// Books the demo's visits from a week back to a week ahead at every site, through the real booking
// service (the built app over HTTP), so a newcomer's first Chairboard is full and correct.
// Runs only when the demo sites have no visits yet. The booking service refuses past starts, so
// this private server runs with its booking clock a week and a day back (server/utils/clock.ts):
// every rule (grid, notice, shifts, blocks, clashes) still applies. Last week's visits are then
// moved along their states as a real week would leave them: most finished, a few missed or
// cancelled, today's under way, some of the next days confirmed. A visit's state follows its time
// (arrived and in treatment only on its day), so each past day is settled through the state API of
// a private server whose clock reads late that evening, and today's on a server with the real clock.
import { DateTime } from 'luxon'
import { Faker, en } from '@faker-js/faker'
import { createDb, dbSettingsFromEnv } from '../db/connection'
import { startAppServer } from './lib/app-server'

const DAYS_BACK = 7
const DAYS_AHEAD = 7
const HOUR = 3_600_000
const CANCEL_REASONS = ['Patient unwell', 'Work conflict', 'Asked to rebook next month', 'Transport fell through']
// Busy in the city, quieter out of town: the Balance screen has an imbalance to show.
const VISITS_PER_ROOM_PER_DAY: Record<string, number> = { 'quarry-street': 7, 'aspen-gulch': 5, 'saguaro-flats': 3 }
const MIX = [
  { weight: 5, items: (f: Faker) => [{ templateCode: 'COMP-POST', tooth: f.helpers.arrayElement(['3', '14', '19', '30', '4', '13', '20', '29']), surfaces: f.helpers.arrayElement(['O', 'MO', 'DO', 'MOD', 'MODB']) }] },
  { weight: 2, items: (f: Faker) => [{ templateCode: 'COMP-ANT', tooth: f.helpers.arrayElement(['7', '8', '9', '10', '23', '26']), surfaces: f.helpers.arrayElement(['M', 'D', 'MI', 'DF']) }] },
  { weight: 5, items: () => [{ templateCode: 'CLEAN-ADULT' }] },
  { weight: 1, items: () => [{ templateCode: 'CLEAN-CHILD' }] },
  { weight: 2, items: () => [{ templateCode: 'EXAM-NEW' }] },
  { weight: 1, items: () => [{ templateCode: 'EXAM-EMER' }] },
  { weight: 1, items: (f: Faker) => [{ templateCode: 'SEAL', tooth: f.helpers.arrayElement(['3', '14', '19', '30']) }] },
  { weight: 1, items: (f: Faker) => [{ templateCode: 'EXT-SIMPLE', tooth: f.helpers.arrayElement(['1', '16', '17', '32']) }] },
]

interface Opening { siteId: number; operatoryId: number; providerId: number; startUtc: string }

const db = createDb(dbSettingsFromEnv())
const existing = await db('visits').count({ count: '*' }).first()
if (Number(existing?.count ?? 0) > 0) {
  console.log('demo visits skipped: visits exist already')
  await db.destroy()
  process.exit(0)
}
const sites = await db('sites').whereIn('slug', ['quarry-street', 'aspen-gulch', 'saguaro-flats']).select('id', 'time_zone', 'name', 'slug')
const roomCounts = new Map((await db('operatories').whereIn('site_id', sites.map((site) => site.id)).groupBy('site_id').select('site_id').count({ count: '*' })).map((row) => [Number((row as { site_id: number }).site_id), Number(row.count)]))
const patientIds: number[] = await db('patients').orderBy('id').pluck('id')
await db.destroy()

const faker = new Faker({ locale: [en] })
faker.seed(20261202)
// Its dispatcher stays off: the real server sends the invitations, with links to its own address
// (and skips those whose visit has begun, see the dispatcher).
const server = await startAppServer({
  NUXT_OUTBOX_DISPATCHER: 'false',
  NUXT_SCHEDULE_CLOCK_OFFSET_MINUTES: String(-(DAYS_BACK + 1) * 24 * 60),
})
let booked = 0
try {
  const post = await signedInPost(server.url)
  for (const site of sites) {
    for (let day = -DAYS_BACK; day <= DAYS_AHEAD; day += 1) {
      const date = DateTime.now().setZone(site.time_zone).plus({ days: day }).toISODate()!
      const target = (roomCounts.get(site.id) ?? 1) * (VISITS_PER_ROOM_PER_DAY[site.slug] ?? 4)
      let bookedToday = 0
      for (let attempt = 0; attempt < target * 2 && bookedToday < target; attempt += 1) {
        const choice = faker.helpers.weightedArrayElement(MIX.map((entry) => ({ weight: entry.weight, value: entry })))
        const items = choice.items(faker)
        const found = await post<{ openings: Opening[] }>('/api/openings', { items, siteIds: [site.id], from: date, to: date, limit: 25, partOfDay: faker.helpers.arrayElement(['morning', 'afternoon', 'any']) })
        const opening = found.status === 200 ? faker.helpers.arrayElement(found.body.openings.length ? found.body.openings.slice(0, 6) : [null]) : null
        if (!opening) continue
        const result = await post('/api/visits', { ...opening, patientId: faker.helpers.arrayElement(patientIds), items, note: '' })
        if (result.status === 201) { booked += 1; bookedToday += 1 }
      }
    }
  }
  console.log(`booked ${booked} demo visits through the booking service`)
  await server.stop() // its clock is a week back: states are set below on servers whose clock is on each visit's day
  const settled = await settleVisits(sites)
  console.log(`moved ${settled} of them along their states (finished, missed, cancelled, under way, confirmed)`)
  console.log(`${await skipHistoricMail()} outbox messages left unsent: due or about visits before the demo began`)
  console.log(`stranded ${await strandOneVisit(sites)} demo visit for the Rebook list (a chair block under it)`)
} finally {
  await server.stop()
}

type Post = <T>(path: string, body: unknown) => Promise<{ status: number; body: T }>

async function signedInPost(url: string): Promise<Post> {
  const login = await fetch(`${url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'admin@fernhollow.test', password: 'cuspline-demo' }) })
  const cookie = login.headers.getSetCookie()[0]!.split(';')[0]!
  return async <T>(path: string, body: unknown) => {
    const response = await fetch(`${url}${path}`, { method: 'POST', headers: { cookie, 'content-type': 'application/json' }, body: JSON.stringify(body) })
    return { status: response.status, body: await response.json() as T }
  }
}

/** The state moves a visit at this time would have had by now, through the state API. */
function movesFor(visit: { start_utc: Date; end_utc: Date }, nowMs: number): Array<{ path: 'state' | 'cancel'; body: Record<string, string> }> {
  const walkIn = [{ path: 'state' as const, body: { state: 'arrived' } }, { path: 'state' as const, body: { state: 'treating' } }]
  if (visit.end_utc.getTime() <= nowMs) {
    const roll = faker.number.float()
    if (roll < 0.08) return [{ path: 'state', body: { state: 'missed' } }]
    if (roll < 0.15) return [{ path: 'cancel', body: { reason: faker.helpers.arrayElement(CANCEL_REASONS) } }]
    return [...walkIn, { path: 'state', body: { state: 'finished' } }]
  }
  if (visit.start_utc.getTime() <= nowMs) return walkIn
  if (visit.start_utc.getTime() <= nowMs + 48 * HOUR && faker.number.float() < 0.5) return [{ path: 'state', body: { state: 'confirmed' } }]
  return []
}

/**
 * The instant that is late in the evening of local date `date` at every demo site: ten minutes
 * before the first of their midnights, so it is still `date` everywhere and after every visit.
 */
function lateOn(date: string, zones: string[]): number {
  return Math.min(...zones.map((zone) => DateTime.fromISO(date, { zone }).plus({ days: 1 }).toMillis())) - 10 * 60_000
}

async function settleVisits(demoSites: Array<{ id: number; time_zone: string }>): Promise<number> {
  const reader = createDb(dbSettingsFromEnv())
  const realNow = Date.now()
  const visits = await reader('visits').where('start_utc', '<', new Date(realNow + 48 * HOUR)).orderBy('id').select('id', 'site_id', 'start_utc', 'end_utc')
  await reader.destroy()
  const zoneOf = new Map(demoSites.map((site) => [site.id, site.time_zone]))
  const zones = [...new Set(zoneOf.values())]
  // Visits grouped by the clock that settles them: late on their (past) day, or the real now.
  const byClock = new Map<number, typeof visits>()
  for (const visit of visits) {
    const day = DateTime.fromJSDate(visit.start_utc, { zone: zoneOf.get(visit.site_id) ?? 'UTC' }).toISODate()!
    const clock = Math.min(lateOn(day, zones), realNow)
    byClock.set(clock, [...(byClock.get(clock) ?? []), visit])
  }
  let settled = 0
  for (const clock of [...byClock.keys()].sort((a, b) => a - b)) {
    const offsetMinutes = clock === realNow ? 0 : Math.round((clock - Date.now()) / 60_000)
    const dayServer = await startAppServer({ NUXT_OUTBOX_DISPATCHER: 'false', NUXT_SCHEDULE_CLOCK_OFFSET_MINUTES: String(offsetMinutes) })
    try {
      const post = await signedInPost(dayServer.url)
      for (const visit of byClock.get(clock)!) {
        const moves = movesFor(visit, clock)
        for (const move of moves) {
          const result = await post(`/api/visits/${visit.id}/${move.path}`, move.body)
          if (result.status !== 200) throw new Error(`demo visit ${visit.id}: ${move.path} ${JSON.stringify(move.body)} answered ${result.status} ${JSON.stringify(result.body)}`)
        }
        if (moves.length) settled += 1
      }
    } finally {
      await dayServer.stop()
    }
  }
  return settled
}

/**
 * Mail the shifted clock queued for times already gone (last week's invitations, reminders due
 * before today) would reach nobody in a real week: marked skipped, so the real server sends only
 * what a patient booked today would get.
 */
async function skipHistoricMail(): Promise<number> {
  const writer = createDb(dbSettingsFromEnv())
  const reason = 'demo history: due before the demo began'
  const now = new Date()
  const overdue = await writer('outbox').where({ state: 'queued', kind: 'reminder' }).where('due_at', '<', now).update({ state: 'skipped', last_error: reason })
  const past = await writer('outbox').where({ state: 'queued' })
    .whereIn('visit_id', writer('visits').where('start_utc', '<', now).select('id'))
    .update({ state: 'skipped', last_error: reason })
  await writer.destroy()
  return overdue + past
}

/**
 * One booked visit a few days ahead at the first demo site gets a chair block laid exactly over it
 * ("Handpiece repair"), through the real route on a server with the real clock: the change flags it,
 * so a newcomer finds it on the Rebook list and marked "needs a new time" on the Chairboard.
 */
async function strandOneVisit(demoSites: Array<{ id: number; time_zone: string; slug: string }>): Promise<number> {
  const site = demoSites.find((one) => one.slug === 'quarry-street') ?? demoSites[0]
  if (!site) return 0
  const reader = createDb(dbSettingsFromEnv())
  const visit = await reader('visits').where({ site_id: site.id, state: 'booked' })
    .where('start_utc', '>', new Date(Date.now() + 48 * HOUR)).orderBy('start_utc').first('id', 'operatory_id', 'start_utc', 'end_utc')
  await reader.destroy()
  if (!visit) return 0
  const start = DateTime.fromJSDate(visit.start_utc, { zone: site.time_zone })
  const end = DateTime.fromJSDate(visit.end_utc, { zone: site.time_zone })
  const realServer = await startAppServer({ NUXT_OUTBOX_DISPATCHER: 'false' })
  try {
    const post = await signedInPost(realServer.url)
    const result = await post<{ strandedVisits?: unknown[] }>('/api/blocks', {
      siteId: site.id, operatoryId: visit.operatory_id, providerId: null, startDate: start.toISODate(),
      localStart: start.toFormat('HH:mm'), localEnd: end.toFormat('HH:mm'), reason: 'Handpiece repair',
    })
    if (result.status !== 201) throw new Error(`demo block answered ${result.status} ${JSON.stringify(result.body)}`)
    return result.body.strandedVisits?.length ?? 0
  } finally {
    await realServer.stop()
  }
}
