// Issue 17 §2: waitlist matching on each kind of freed time. A cancellation and "did not come" are in
// waitlist.test.ts; here a move out of a slot, a shortened visit (its end moved earlier) and new provider
// time (a new shift, an extra day), each asked of GET /api/waitlist/matches the way the screens ask it:
// the chair and times a move or shortening gave up (`freedByChange`), or the site and the window a new
// shift or extra day added (`freed` in the save's answer; no chair: every chair of the site).
// For each, the same question before the change finds nobody, so the match comes from the freed time.
// Private annexes only; every date and time is computed from today.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { randomUUID } from 'node:crypto'
import { signedInAs, type ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt, type Annex } from '../helpers/booking-fixtures'
import { createStaff, middayZone, startIn } from '../helpers/midday'
import { freedByChange } from '../../shared/domain/freed-time'
import { addDays, todayIn } from '../../shared/utils/local-date'

let admin: ApiClient

beforeAll(async () => {
  admin = await signedInAs('admin@fernhollow.test')
})
afterAll(async () => { await closeTestDb() })

interface Match { entry: { id: number }; startUtc: string; operatoryId: number; providerId: number }

async function waitFor(annex: Annex, patientIndex: number) {
  const today = todayIn(annex.timeZone)
  const response = await admin.post('/api/waitlist', { patientId: annex.patientIds[patientIndex], siteId: annex.siteId, items: FILLING, from: today, to: addDays(today, 5), priority: 2, noticeMinutes: 0, partOfDay: 'any' })
  expect(response.status, JSON.stringify(response.body)).toBe(201)
  return response.body as { id: number }
}

async function matchesFor(query: Record<string, string | number>): Promise<Match[]> {
  const response = await admin.get(`/api/waitlist/matches?${new URLSearchParams(Object.entries(query).map(([key, value]) => [key, String(value)]))}`)
  expect(response.status, JSON.stringify(response.body)).toBe(200)
  return response.body.matches as Match[]
}

const iso = (ms: number) => new Date(ms).toISOString()
const placeOf = (visit: { siteId: number; operatoryId: number; startUtc: string; endUtc: string }) => ({ siteId: visit.siteId, operatoryId: visit.operatoryId, startMs: Date.parse(visit.startUtc), endMs: Date.parse(visit.endUtc) })

describe('visits that give up chair time', () => {
  let annex: Annex
  beforeAll(async () => {
    annex = await createAnnex({ rooms: 1, providers: 1, patients: 4, timeZone: middayZone() })
  })

  async function book(patientIndex: number, startUtc: string) {
    const response = await admin.post('/api/visits', { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[patientIndex], items: FILLING, startUtc })
    expect(response.status, JSON.stringify(response.body)).toBe(201)
    return response.body as { id: number; siteId: number; operatoryId: number; startUtc: string; endUtc: string; rowVersion: number }
  }

  it('a move out of a slot: the slot it left fits a waiting patient', async () => {
    const visit = await book(0, startIn(120))
    const entry = await waitFor(annex, 1)
    const slot = { siteId: annex.siteId, operatoryId: visit.operatoryId, startUtc: visit.startUtc, endUtc: visit.endUtc }
    expect((await matchesFor(slot)).map((match) => match.entry.id)).not.toContain(entry.id)

    const moved = await admin.patch(`/api/visits/${visit.id}`, { rowVersion: visit.rowVersion, startUtc: startIn(60 * 24 + 120) })
    expect(moved.status, JSON.stringify(moved.body)).toBe(200)
    const [freed] = freedByChange(placeOf(visit), placeOf(moved.body))
    expect(freed).toEqual(placeOf(visit))
    const matches = await matchesFor({ siteId: freed!.siteId, operatoryId: freed!.operatoryId, startUtc: iso(freed!.startMs), endUtc: iso(freed!.endMs) })
    expect(matches.find((match) => match.entry.id === entry.id)).toMatchObject({ startUtc: iso(Date.parse(visit.startUtc)), operatoryId: visit.operatoryId })
    await admin.post(`/api/waitlist/${entry.id}/close`, { reason: 'test done' })
  })

  it('a shortened visit (a procedure taken out): its freed tail fits a waiting patient', async () => {
    const twoFillings = [...FILLING, { templateCode: 'COMP-POST', tooth: '30', surfaces: 'O' }]
    const response = await admin.post('/api/visits', { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[2], items: twoFillings, startUtc: startIn(60 * 6) })
    expect(response.status, JSON.stringify(response.body)).toBe(201)
    const visit = response.body as { id: number; siteId: number; operatoryId: number; startUtc: string; endUtc: string; rowVersion: number }
    const entry = await waitFor(annex, 3)
    const tailOf = (endUtc: string) => ({ siteId: annex.siteId, operatoryId: visit.operatoryId, startUtc: endUtc, endUtc: visit.endUtc })
    // While the visit holds its whole time, its second half fits nobody.
    const half = Date.parse(visit.startUtc) + (Date.parse(visit.endUtc) - Date.parse(visit.startUtc)) / 2
    expect((await matchesFor(tailOf(iso(Math.ceil(half / 300_000) * 300_000)))).map((match) => match.entry.id)).not.toContain(entry.id)

    const shortened = await admin.patch(`/api/visits/${visit.id}`, { rowVersion: visit.rowVersion, items: FILLING })
    expect(shortened.status, JSON.stringify(shortened.body)).toBe(200)
    expect(Date.parse(shortened.body.endUtc)).toBeLessThan(Date.parse(visit.endUtc))
    expect(shortened.body.startUtc).toBe(visit.startUtc)
    const freed = freedByChange(placeOf(visit), placeOf(shortened.body))
    expect(freed).toEqual([{ ...placeOf(visit), startMs: Date.parse(shortened.body.endUtc) }])
    const matches = await matchesFor(tailOf(shortened.body.endUtc))
    expect(matches.find((match) => match.entry.id === entry.id)).toMatchObject({ startUtc: shortened.body.endUtc, operatoryId: visit.operatoryId })
  })

})

describe('new provider time', () => {
  // A site with chairs but nobody on shift: only the new shift or extra day brings a provider.
  let annex: Annex
  let today: string
  beforeAll(async () => {
    annex = await createAnnex({ rooms: 2, providers: 0, patients: 3, timeZone: middayZone() })
    today = todayIn(annex.timeZone)
    for (const patientId of annex.patientIds) await testDb()('patients').where({ id: patientId }).update({ email: `freed-${randomUUID().slice(0, 8)}@fernhollow.test`, email_consent: true })
  })

  async function newDentist(): Promise<number> {
    const staff = await createStaff('dentist', [annex.siteId], { provider: true })
    return staff.providerId!
  }

  it('a new shift: its window, answered with the save, fits a waiting patient on any chair, and offers can go out', async () => {
    const providerId = await newDentist()
    const entry = await waitFor(annex, 0)
    // Local 11:00–12:00 now (middayZone), so 13:00–17:00 today is ahead.
    const window = { siteId: annex.siteId, startUtc: utcAt(`${today}T13:00`, annex.timeZone), endUtc: utcAt(`${today}T17:00`, annex.timeZone) }
    expect(await matchesFor(window)).toEqual([])

    const shift = await admin.post('/api/shifts', { providerId, siteId: annex.siteId, rrule: 'FREQ=DAILY', validFrom: today, validUntil: addDays(today, 1), localStart: '13:00', localEnd: '17:00' })
    expect(shift.status, JSON.stringify(shift.body)).toBe(201)
    expect(shift.body.freed).toEqual([
      { siteId: annex.siteId, startUtc: iso(Date.parse(window.startUtc)), endUtc: iso(Date.parse(window.endUtc)) },
      { siteId: annex.siteId, startUtc: iso(Date.parse(utcAt(`${addDays(today, 1)}T13:00`, annex.timeZone))), endUtc: iso(Date.parse(utcAt(`${addDays(today, 1)}T17:00`, annex.timeZone))) },
    ])
    const first = shift.body.freed[0] as { siteId: number; startUtc: string; endUtc: string }
    const matches = await matchesFor(first)
    const match = matches.find((one) => one.entry.id === entry.id)
    expect(match).toMatchObject({ startUtc: first.startUtc, providerId })
    expect(annex.operatoryIds).toContain(match!.operatoryId)

    const offers = await admin.post('/api/waitlist/offers', { ...first, entryIds: [entry.id] })
    expect(offers.status, JSON.stringify(offers.body)).toBe(200)
    expect(offers.body.sent.map((sent: { entryId: number }) => sent.entryId)).toEqual([entry.id])
    expect((await testDb()('offers').where({ entry_id: entry.id }).first('operatory_id', 'provider_id'))).toEqual({ operatory_id: match!.operatoryId, provider_id: providerId })
    await admin.post(`/api/waitlist/${entry.id}/close`, { reason: 'test done' })
  })

  it('an extra day: its window fits a waiting patient; time off adds nothing', async () => {
    const providerId = await newDentist()
    const entry = await waitFor(annex, 1)
    const day = addDays(today, 3)
    const window = { siteId: annex.siteId, startUtc: iso(Date.parse(utcAt(`${day}T09:00`, annex.timeZone))), endUtc: iso(Date.parse(utcAt(`${day}T12:30`, annex.timeZone))) }
    expect(await matchesFor(window)).toEqual([])

    const extra = await admin.post('/api/shift-exceptions', { providerId, kind: 'extra', siteId: annex.siteId, startDate: day, endDate: day, localStart: '09:00', localEnd: '12:30' })
    expect(extra.status, JSON.stringify(extra.body)).toBe(201)
    expect(extra.body.freed).toEqual([window])
    const match = (await matchesFor(window)).find((one) => one.entry.id === entry.id)
    expect(match).toMatchObject({ startUtc: window.startUtc, providerId })

    const away = await admin.post('/api/shift-exceptions', { providerId, kind: 'time_off', siteId: annex.siteId, startDate: addDays(day, 1), endDate: addDays(day, 1) })
    expect(away.status, JSON.stringify(away.body)).toBe(201)
    expect(away.body.freed).toEqual([])
  })

  it('a gap without a chair is still checked: bad site, too long, or not after its start is a 400 naming the field', async () => {
    const start = utcAt(`${today}T13:00`, annex.timeZone)
    const tooLong = await admin.get(`/api/waitlist/matches?siteId=${annex.siteId}&startUtc=${start}&endUtc=${iso(Date.parse(start) + 13 * 3_600_000)}`)
    expect(tooLong.status).toBe(400)
    expect(tooLong.body.data.field).toBe('endUtc')
    const noTimes = await admin.get(`/api/waitlist/matches?siteId=${annex.siteId}`)
    expect(noTimes.status).toBe(400)
    expect(noTimes.body.data.field).toBe('visitId')
    const noSite = await admin.get(`/api/waitlist/matches?siteId=99999999&startUtc=${start}&endUtc=${iso(Date.parse(start) + 3_600_000)}`)
    expect(noSite.status).toBe(400)
    expect(noSite.body.data.field).toBe('siteId')
  })
})
