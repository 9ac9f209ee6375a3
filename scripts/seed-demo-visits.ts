// Books the demo's visits from now to two weeks ahead at every site, through the real booking
// service (the built app over HTTP), so a newcomer's first Chairboard is full and correct.
// Runs only when the demo sites have no visits yet. Visits cannot be booked in the past, so the
// demo starts now rather than a week back.
import { DateTime } from 'luxon'
import { Faker, en } from '@faker-js/faker'
import { createDb, dbSettingsFromEnv } from '../db/connection'
import { startAppServer } from './lib/app-server'

const DAYS_AHEAD = 14
const VISITS_PER_ROOM_PER_DAY = 4
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
const existing = await db('appointments').count({ count: '*' }).first()
if (Number(existing?.count ?? 0) > 0) {
  console.log('demo visits skipped: visits exist already')
  await db.destroy()
  process.exit(0)
}
const sites = await db('sites').whereIn('slug', ['quarry-street', 'aspen-gulch', 'saguaro-flats']).select('id', 'time_zone', 'name')
const roomCounts = new Map((await db('operatories').whereIn('site_id', sites.map((site) => site.id)).groupBy('site_id').select('site_id').count({ count: '*' })).map((row) => [Number((row as { site_id: number }).site_id), Number(row.count)]))
const patientIds: number[] = await db('patients').orderBy('id').pluck('id')
await db.destroy()

const faker = new Faker({ locale: [en] })
faker.seed(20261202)
// Its dispatcher stays off: the real server sends the invitations, with links to its own address.
const server = await startAppServer({ NUXT_OUTBOX_DISPATCHER: 'false' })
let booked = 0
try {
  const login = await fetch(`${server.url}/api/auth/login`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify({ email: 'admin@fernhollow.test', password: 'cuspline-demo' }) })
  const cookie = login.headers.getSetCookie()[0]!.split(';')[0]!
  const post = async <T>(path: string, body: unknown): Promise<{ status: number; body: T }> => {
    const response = await fetch(`${server.url}${path}`, { method: 'POST', headers: { cookie, 'content-type': 'application/json' }, body: JSON.stringify(body) })
    return { status: response.status, body: await response.json() as T }
  }
  for (const site of sites) {
    for (let day = 0; day < DAYS_AHEAD; day += 1) {
      const date = DateTime.now().setZone(site.time_zone).plus({ days: day }).toISODate()!
      const target = (roomCounts.get(site.id) ?? 1) * VISITS_PER_ROOM_PER_DAY
      let bookedToday = 0
      for (let attempt = 0; attempt < target * 2 && bookedToday < target; attempt += 1) {
        const choice = faker.helpers.weightedArrayElement(MIX.map((entry) => ({ weight: entry.weight, value: entry })))
        const items = choice.items(faker)
        const found = await post<{ openings: Opening[] }>('/api/openings', { items, siteIds: [site.id], from: date, to: date, limit: 25, partOfDay: faker.helpers.arrayElement(['morning', 'afternoon', 'any']) })
        const opening = found.status === 200 ? faker.helpers.arrayElement(found.body.openings.length ? found.body.openings.slice(0, 6) : [null]) : null
        if (!opening) continue
        const result = await post('/api/appointments', { ...opening, patientId: faker.helpers.arrayElement(patientIds), items, note: '' })
        if (result.status === 201) { booked += 1; bookedToday += 1 }
      }
    }
  }
  console.log(`booked ${booked} demo visits through the booking service`)
} finally {
  await server.stop()
}
