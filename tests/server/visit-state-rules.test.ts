// Issue 11 §5: a visit's state follows its time (on the site's local day) and only the site's desk,
// its managers and admins, or the visit's own provider may move it through its states.
// Visits "today" are booked in a test annex whose zone makes it late morning now, so the suite
// passes at any hour; visits that began earlier are set back in the database (the API never books
// a past start).
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import type { DisplayStyle } from '../../shared/types/display'
import { formatDate, formatTime } from '../../shared/utils/display-time'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { createStaff, middayZone, startIn, STAFF_PASSWORD } from '../helpers/midday'

let annex: Annex
let admin: ApiClient
let patient = 0

beforeAll(async () => {
  annex = await createAnnex({ rooms: 4, providers: 2, patients: 30, timeZone: middayZone() })
  admin = await signedInAs('admin@fernhollow.test')
})
afterAll(async () => { await closeTestDb() })
// Each test starts with the annex's chairs and providers free again (every test books around now).
const bookedIds: number[] = []
afterEach(async () => { if (bookedIds.length) await testDb()('visit_segments').whereIn('visit_id', bookedIds).delete() })

async function book(startUtc: string, options: { providerIndex?: number; operatoryIndex?: number } = {}) {
  const response = await admin.post('/api/visits', {
    siteId: annex.siteId, operatoryId: annex.operatoryIds[options.operatoryIndex ?? patient % 4], providerId: annex.providerIds[options.providerIndex ?? 0],
    patientId: annex.patientIds[patient++], items: FILLING, startUtc,
  })
  expect(response.status, JSON.stringify(response.body)).toBe(201)
  bookedIds.push(response.body.id)
  return response.body as { id: number; startUtc: string; segments: unknown[] }
}

/** The visit as if booked `minutes` ago (the booking API refuses past starts). */
async function setBack(id: number, minutes: number) {
  await testDb()('visits').where({ id }).update({
    start_utc: testDb().raw('start_utc - INTERVAL ? MINUTE', [minutes]), end_utc: testDb().raw('end_utc - INTERVAL ? MINUTE', [minutes]),
  })
  await testDb()('visit_segments').where({ visit_id: id }).update({
    start_utc: testDb().raw('start_utc - INTERVAL ? MINUTE', [minutes]), end_utc: testDb().raw('end_utc - INTERVAL ? MINUTE', [minutes]),
  })
}

/** The annex's display style as stored (the refusals read on its clock and in its date order). */
async function annexStyle(): Promise<DisplayStyle> {
  const site = (await admin.get(`/api/sites/${annex.siteId}`)).body as DisplayStyle
  return { timeZone: site.timeZone, clock: site.clock, dateOrder: site.dateOrder }
}

const stateOf = async (id: number) => (await testDb()('visits').where({ id }).first('state')).state as string
const segmentCount = async (id: number) => Number((await testDb()('visit_segments').where({ visit_id: id }).count({ n: '*' }).first())!.n)

describe('a visit\'s state follows its time', () => {
  it('a visit weeks ahead cannot be marked did not come or arrived, and keeps its chair', async () => {
    const visit = await book(startIn(21 * 24 * 60))
    const style = await annexStyle()
    const missed = await admin.post(`/api/visits/${visit.id}/state`, { state: 'missed' })
    expect(missed.status).toBe(409)
    expect(missed.body.message).toBe(`The visit starts ${formatDate(visit.startUtc, style)} at ${formatTime(visit.startUtc, style)}: it can be marked did not come only after its start.`)
    const arrived = await admin.post(`/api/visits/${visit.id}/state`, { state: 'arrived' })
    expect(arrived.status).toBe(409)
    expect(arrived.body.message).toBe(`${formatDate(visit.startUtc, style)} is not today: a visit can be marked arrived only on its day.`)
    expect(await stateOf(visit.id)).toBe('booked')
    expect(await segmentCount(visit.id)).toBeGreaterThan(0)
  })

  it('a visit later today: arrived only from 60 minutes before its start, missed only after it, on the site\'s clock', async () => {
    const visit = await book(startIn(120))
    const startMs = Date.parse(visit.startUtc)
    const expected = (style: DisplayStyle) => `The visit starts at ${formatTime(startMs, style)}: it can be marked arrived from ${formatTime(startMs - 60 * 60_000, style)}, 60 minutes before.`
    // A new site reads with a 12-hour clock ('1:35 PM')…
    const twelve = await annexStyle()
    expect(twelve.clock).toBe('12h')
    const early = await admin.post(`/api/visits/${visit.id}/state`, { state: 'arrived' })
    expect(early.status).toBe(409)
    expect(early.body.message).toBe(expected(twelve))
    expect(early.body.message).toMatch(/ [AP]M: /)
    // …and once the site chooses a 24-hour clock and the day first, the same refusal follows it ('13:35').
    expect((await admin.patch(`/api/sites/${annex.siteId}`, { clock: '24h', dateOrder: 'day-month-year' })).status).toBe(200)
    try {
      const twentyFour = await annexStyle()
      expect(twentyFour).toMatchObject({ clock: '24h', dateOrder: 'day-month-year' })
      const again = await admin.post(`/api/visits/${visit.id}/state`, { state: 'arrived' })
      expect(again.body.message).toBe(expected(twentyFour))
      expect(again.body.message).not.toMatch(/[AP]M/)
    } finally {
      await admin.patch(`/api/sites/${annex.siteId}`, { clock: '12h', dateOrder: 'month-day-year' })
    }
    const missed = await admin.post(`/api/visits/${visit.id}/state`, { state: 'missed' })
    expect(missed.status).toBe(409)
    expect(missed.body.message).toMatch(/it can be marked did not come only after its start\.$/)
  })

  it('a visit starting within the hour goes arrived → in treatment → finished', async () => {
    const visit = await book(startIn(30))
    for (const state of ['arrived', 'treating', 'finished']) {
      const response = await admin.post(`/api/visits/${visit.id}/state`, { state })
      expect(response.status, JSON.stringify(response.body)).toBe(200)
      expect(response.body.state).toBe(state)
    }
  })

  it('a visit that began can be marked did not come, which frees its chair', async () => {
    const visit = await book(startIn(30))
    await setBack(visit.id, 60)
    const response = await admin.post(`/api/visits/${visit.id}/state`, { state: 'missed' })
    expect(response.status).toBe(200)
    expect(response.body).toMatchObject({ state: 'missed', segments: [] })
  })

  it('treatment starts only on the visit\'s day; a visit left in treatment can be finished the day after', async () => {
    const visit = await book(startIn(30))
    expect((await admin.post(`/api/visits/${visit.id}/state`, { state: 'arrived' })).status).toBe(200)
    await setBack(visit.id, 24 * 60)
    const yesterday = formatDate(Date.now() - 86_400_000, await annexStyle())
    const treating = await admin.post(`/api/visits/${visit.id}/state`, { state: 'treating' })
    expect(treating.status).toBe(409)
    expect(treating.body.message).toBe(`${yesterday} is not today: a visit can be marked in treatment only on its day.`)

    const forgotten = await book(startIn(30))
    expect((await admin.post(`/api/visits/${forgotten.id}/state`, { state: 'arrived' })).status).toBe(200)
    expect((await admin.post(`/api/visits/${forgotten.id}/state`, { state: 'treating' })).status).toBe(200)
    await setBack(forgotten.id, 24 * 60)
    const finished = await admin.post(`/api/visits/${forgotten.id}/state`, { state: 'finished' })
    expect(finished.status).toBe(200)
    expect(finished.body.state).toBe('finished')
  })
})

describe('who may change a visit', () => {
  let ownProvider: ApiClient
  let otherDentist: ApiClient
  let hygienist: ApiClient
  let assistant: ApiClient
  let desk: ApiClient
  let foreignDesk: ApiClient

  async function signIn(email: string, password = STAFF_PASSWORD) {
    const client = new ApiClient()
    await client.signIn(email, password)
    return client
  }
  async function providerEmail(providerId: number) {
    return (await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('providers.id', providerId).first('users.email')).email as string
  }

  beforeAll(async () => {
    ownProvider = await signIn(await providerEmail(annex.providerIds[0]!), 'annex-provider-password')
    otherDentist = await signIn(await providerEmail(annex.providerIds[1]!), 'annex-provider-password')
    hygienist = await signIn((await createStaff('hygienist', [annex.siteId], { provider: true })).email)
    assistant = await signIn((await createStaff('assistant', [annex.siteId])).email)
    desk = await signIn((await createStaff('front_desk', [annex.siteId])).email)
    foreignDesk = await signedInAs('desk.quarry@fernhollow.test')
  })

  const NOT_YOURS = 'Only the front desk, managers and admins of this site, or the visit\'s own provider, may change this visit\'s state.'

  it('another dentist, a hygienist or an assistant at the site may not move another provider\'s visit: 403 in words', async () => {
    const visit = await book(startIn(30))
    for (const client of [otherDentist, hygienist, assistant]) {
      for (const state of ['arrived', 'missed', 'confirmed']) {
        const response = await client.post(`/api/visits/${visit.id}/state`, { state })
        expect(response.status).toBe(403)
        expect(response.body.message).toBe(NOT_YOURS)
      }
    }
    expect(await stateOf(visit.id)).toBe('booked')
  })

  it('another site\'s front desk may not either', async () => {
    const visit = await book(startIn(30))
    const response = await foreignDesk.post(`/api/visits/${visit.id}/state`, { state: 'arrived' })
    expect(response.status).toBe(403)
    expect(response.body.message).toBe('This site is outside your sites.')
  })

  it('the visit\'s own provider and the site\'s front desk may', async () => {
    const mine = await book(startIn(30))
    for (const state of ['arrived', 'treating', 'finished']) {
      expect((await ownProvider.post(`/api/visits/${mine.id}/state`, { state })).body.state).toBe(state)
    }
    const desks = await book(startIn(30), { providerIndex: 1 })
    expect((await desk.post(`/api/visits/${desks.id}/state`, { state: 'arrived' })).body.state).toBe('arrived')
  })

  it('a provider, even the visit\'s own, may not move, change the length of or cancel it: 403', async () => {
    const visit = await book(startIn(3 * 24 * 60))
    const move = await ownProvider.patch(`/api/visits/${visit.id}`, { rowVersion: 1, startUtc: startIn(3 * 24 * 60 + 60) })
    expect(move.status).toBe(403)
    const length = await ownProvider.patch(`/api/visits/${visit.id}`, { rowVersion: 1, lengthOverride: { chairMinutes: 120, reason: 'anxious patient' } })
    expect(length.status).toBe(403)
    const cancel = await ownProvider.post(`/api/visits/${visit.id}/cancel`, { reason: 'not mine to cancel' })
    expect(cancel.status).toBe(403)
    expect(cancel.body.message).toBe('Your role does not allow this.')
    expect(await stateOf(visit.id)).toBe('booked')
  })
})
