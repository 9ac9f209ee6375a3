// Issue 13 §4: "anaesthetic given" is recorded once, by the visit's provider, an assistant or a manager
// or admin of the site, on a visit with numbing whose patient has arrived; the numbing countdown runs
// from it (shared/domain/numbing-clock.ts). Private annex with a late-morning zone (tests/helpers/midday.ts).
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { createStaff, middayZone, startIn, STAFF_PASSWORD } from '../helpers/midday'

let annex: Annex
let admin: ApiClient
let assistant: ApiClient
let desk: ApiClient
let otherDentist: ApiClient
let patient = 0

async function signIn(email: string, password = STAFF_PASSWORD) {
  const client = new ApiClient()
  await client.signIn(email, password)
  return client
}

beforeAll(async () => {
  annex = await createAnnex({ rooms: 3, providers: 2, patients: 10, timeZone: middayZone() })
  admin = await signedInAs('admin@fernhollow.test')
  assistant = await signIn((await createStaff('assistant', [annex.siteId])).email)
  desk = await signIn((await createStaff('front_desk', [annex.siteId])).email)
  const otherEmail = (await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('providers.id', annex.providerIds[1]).first('users.email')).email as string
  otherDentist = await signIn(otherEmail, 'annex-provider-password')
})
afterAll(async () => { await closeTestDb() })
const bookedIds: number[] = []
afterEach(async () => { if (bookedIds.length) await testDb()('visit_segments').whereIn('visit_id', bookedIds).delete() })

async function book(items: unknown[] = FILLING, operatoryIndex = 0) {
  const response = await admin.post('/api/visits', {
    siteId: annex.siteId, operatoryId: annex.operatoryIds[operatoryIndex], providerId: annex.providerIds[0],
    patientId: annex.patientIds[patient++], items, startUtc: startIn(30),
  })
  expect(response.status, JSON.stringify(response.body)).toBe(201)
  bookedIds.push(response.body.id)
  return response.body as { id: number; rowVersion: number; plan: { anaesthesia: unknown[] } }
}

const give = (client: ApiClient, visit: { id: number; rowVersion: number }) => client.post(`/api/visits/${visit.id}/anaesthetic`, { rowVersion: visit.rowVersion })

describe('anaesthetic given', () => {
  it('is refused before the patient has arrived, then recorded once by an assistant of the site, with an audit row', async () => {
    const visit = await book()
    expect(visit.plan.anaesthesia.length).toBeGreaterThan(0)
    const early = await give(assistant, visit)
    expect(early.status).toBe(409)
    expect(early.body.message).toBe('The patient is not in the chair (the visit is booked): the anaesthetic can be recorded once they have arrived.')
    const arrived = await admin.post(`/api/visits/${visit.id}/state`, { state: 'arrived' })
    const before = Date.now()
    const given = await give(assistant, arrived.body)
    expect(given.status, JSON.stringify(given.body)).toBe(200)
    const givenAt = Date.parse(given.body.anaestheticGivenAt)
    expect(givenAt).toBeGreaterThanOrEqual(before - 1000)
    expect(givenAt).toBeLessThanOrEqual(Date.now() + 1000)
    const audit = await testDb()('audit_log').where({ entity: 'visit', entity_id: String(visit.id), action: 'visit_anaesthetic_given' }).first('after')
    expect(typeof audit.after === 'string' ? JSON.parse(audit.after) : audit.after).toEqual({ anaestheticGivenAt: given.body.anaestheticGivenAt })
    const twice = await give(assistant, given.body)
    expect(twice.status).toBe(409)
    expect(twice.body.message).toBe('The anaesthetic was already recorded for this visit.')
  })

  it('is not for the front desk or another dentist (403), nor a stale version (409)', async () => {
    const visit = await book(FILLING, 1)
    const arrived = (await admin.post(`/api/visits/${visit.id}/state`, { state: 'arrived' })).body
    for (const client of [desk, otherDentist]) {
      const response = await give(client, arrived)
      expect(response.status).toBe(403)
      expect(response.body.message).toBe('Only the visit\'s own provider, the assistants of this site, and its managers and admins may record the anaesthetic.')
    }
    const stale = await give(admin, visit)
    expect(stale.status).toBe(409)
    expect(stale.body.data).toMatchObject({ field: 'rowVersion' })
    expect((await new ApiClient().post(`/api/visits/${visit.id}/anaesthetic`, { rowVersion: 1 })).status).toBe(401)
    expect((await admin.post(`/api/visits/${visit.id}/anaesthetic`, { rowVersion: 'x' })).status).toBe(400)
  })

  it('is refused for a visit without numbing', async () => {
    const visit = await book([{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO', anaesthesia: 'none' }], 2)
    expect(visit.plan.anaesthesia).toEqual([])
    const arrived = (await admin.post(`/api/visits/${visit.id}/state`, { state: 'arrived' })).body
    const response = await give(admin, arrived)
    expect(response.status).toBe(409)
    expect(response.body.message).toBe('This visit has no local anaesthetic planned.')
  })
})
