// Issue 13 §3: the last state change of a visit can be undone by the same roles on the same local day;
// a visit that gave its time back (did not come, cancelled) takes it again only while its chair,
// provider and patient are still free, checked in the booking transaction. Each undo is audited.
// Visits "today" are booked in a private annex whose zone makes it late morning now (tests/helpers/midday.ts).
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { middayZone, startIn } from '../helpers/midday'

let annex: Annex
let admin: ApiClient
let ownProvider: ApiClient
let otherDentist: ApiClient
let patient = 0

async function providerClient(providerId: number) {
  const email = (await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('providers.id', providerId).first('users.email')).email as string
  const client = new ApiClient()
  await client.signIn(email, 'annex-provider-password')
  return client
}

beforeAll(async () => {
  annex = await createAnnex({ rooms: 4, providers: 2, patients: 30, timeZone: middayZone() })
  admin = await signedInAs('admin@fernhollow.test')
  ownProvider = await providerClient(annex.providerIds[0]!)
  otherDentist = await providerClient(annex.providerIds[1]!)
})
afterAll(async () => { await closeTestDb() })
const bookedIds: number[] = []
afterEach(async () => { if (bookedIds.length) await testDb()('visit_segments').whereIn('visit_id', bookedIds).delete() })

interface Visit { id: number; startUtc: string; state: string; rowVersion: number; previousState: string | null; segments: unknown[]; icalSequence: number }

async function book(startUtc: string, options: { providerIndex?: number; operatoryIndex?: number; patientIndex?: number } = {}): Promise<Visit> {
  const response = await admin.post('/api/visits', {
    siteId: annex.siteId, operatoryId: annex.operatoryIds[options.operatoryIndex ?? 0], providerId: annex.providerIds[options.providerIndex ?? 0],
    patientId: annex.patientIds[options.patientIndex ?? patient++], items: FILLING, startUtc,
  })
  expect(response.status, JSON.stringify(response.body)).toBe(201)
  bookedIds.push(response.body.id)
  return response.body as Visit
}

async function setBack(id: number, minutes: number) {
  for (const table of ['visits', 'visit_segments']) {
    await testDb()(table).where(table === 'visits' ? { id } : { visit_id: id }).update({
      start_utc: testDb().raw('start_utc - INTERVAL ? MINUTE', [minutes]), end_utc: testDb().raw('end_utc - INTERVAL ? MINUTE', [minutes]),
    })
  }
}

async function mark(client: ApiClient, visit: { id: number }, state: string): Promise<Visit> {
  const response = await client.post(`/api/visits/${visit.id}/state`, { state })
  expect(response.status, JSON.stringify(response.body)).toBe(200)
  return response.body as Visit
}

const undo = (client: ApiClient, visit: { id: number; rowVersion: number }) => client.post(`/api/visits/${visit.id}/undo`, { rowVersion: visit.rowVersion })
/** JSON columns come back parsed or as text, depending on the driver's reading of the column. */
const jsonOf = (value: unknown) => (typeof value === 'string' ? JSON.parse(value) : value)
const segmentCount = async (id: number) => Number((await testDb()('visit_segments').where({ visit_id: id }).count({ n: '*' }).first())!.n)
const undoAudits = async (id: number) => testDb()('audit_log').where({ entity: 'visit', entity_id: String(id), action: 'visit_state_undone' }).select('before', 'after')

describe('undo the last state change', () => {
  it('arrived goes back to booked (or confirmed), once, with an audit row', async () => {
    const visit = await book(startIn(30))
    let arrived = await mark(admin, visit, 'arrived')
    expect(arrived.previousState).toBe('booked')
    // An anaesthetic recorded for a patient marked arrived by mistake goes with the undo.
    arrived = (await admin.post(`/api/visits/${visit.id}/anaesthetic`, { rowVersion: arrived.rowVersion })).body
    expect(arrived).toMatchObject({ state: 'arrived', previousState: 'booked' })
    const undone = await undo(admin, arrived)
    expect(undone.status, JSON.stringify(undone.body)).toBe(200)
    expect(undone.body).toMatchObject({ state: 'booked', previousState: null, anaestheticGivenAt: null })
    const audits = await undoAudits(visit.id)
    expect(audits).toHaveLength(1)
    expect(jsonOf(audits[0].after)).toEqual({ state: 'booked' })
    const again = await undo(admin, undone.body)
    expect(again.status).toBe(409)
    expect(again.body.message).toBe('There is no state change to undo on this visit.')

    const confirmed = await mark(admin, visit, 'confirmed')
    const arrivedAgain = await mark(admin, confirmed, 'arrived')
    expect((await undo(admin, arrivedAgain)).body.state).toBe('confirmed')
  })

  it('in treatment goes back to arrived and finished to in treatment, by the visit\'s own provider', async () => {
    const visit = await book(startIn(30), { operatoryIndex: 1 })
    await mark(ownProvider, visit, 'arrived')
    const treating = await mark(ownProvider, visit, 'treating')
    expect((await undo(ownProvider, treating)).body.state).toBe('arrived')
    await mark(ownProvider, visit, 'treating')
    const finished = await mark(ownProvider, visit, 'finished')
    const undone = await undo(ownProvider, finished)
    expect(undone.body.state).toBe('treating')
  })

  it('refuses another dentist (403), a stale version (409), a signed-out caller (401) and a missing version (400)', async () => {
    const visit = await book(startIn(30), { operatoryIndex: 2 })
    const arrived = await mark(admin, visit, 'arrived')
    const other = await undo(otherDentist, arrived)
    expect(other.status).toBe(403)
    expect(other.body.message).toBe('Only the front desk, managers and admins of this site, or the visit\'s own provider, may change this visit\'s state.')
    const stale = await undo(admin, { id: visit.id, rowVersion: visit.rowVersion })
    expect(stale.status).toBe(409)
    expect(stale.body.data).toMatchObject({ field: 'rowVersion' })
    expect((await new ApiClient().post(`/api/visits/${visit.id}/undo`, { rowVersion: arrived.rowVersion })).status).toBe(401)
    const missing = await admin.post(`/api/visits/${visit.id}/undo`, {})
    expect(missing.status).toBe(400)
    expect(JSON.stringify(missing.body)).toMatch(/rowVersion/)
  })

  it('only on the local day the change was made', async () => {
    const visit = await book(startIn(30), { operatoryIndex: 3 })
    const arrived = await mark(admin, visit, 'arrived')
    await testDb()('visits').where({ id: visit.id }).update({ state_changed_at: testDb().raw('state_changed_at - INTERVAL 1 DAY') })
    const late = await undo(admin, arrived)
    expect(late.status).toBe(409)
    expect(late.body.message).toBe('The visit became arrived on an earlier day: a change can be undone only on the day it was made.')
  })
})

describe('undo gives back the time only while it is free', () => {
  it('did not come → booked takes the chair and provider back', async () => {
    const visit = await book(startIn(30))
    await setBack(visit.id, 40)
    const missed = await mark(admin, visit, 'missed')
    expect(await segmentCount(visit.id)).toBe(0)
    const undone = await undo(admin, missed)
    expect(undone.status, JSON.stringify(undone.body)).toBe(200)
    expect(undone.body.state).toBe('booked')
    expect(await segmentCount(visit.id)).toBeGreaterThan(0)
  })

  it('did not come is not undone once the chair was given to someone else: 409 naming what took it', async () => {
    const visit = await book(startIn(30), { operatoryIndex: 1 })
    await setBack(visit.id, 40)
    const missed = await mark(admin, visit, 'missed')
    // The freed chair goes to a walk-in with the other dentist.
    const walkIn = await book(startIn(5), { operatoryIndex: 1, providerIndex: 1 })
    const refused = await undo(admin, missed)
    expect(refused.status).toBe(409)
    expect(refused.body.message).toMatch(/^The visit's time is no longer free, so this cannot be undone: Room 2 is already taken from .+\.$/)
    expect(refused.body.data.conflict).toMatchObject({ resource: 'operatory', visitId: walkIn.id })
    expect((await testDb()('visits').where({ id: visit.id }).first('state')).state).toBe('missed')
    expect(await segmentCount(visit.id)).toBe(0)
  })

  it('a cancellation is undone while chair, provider and patient are free: segments back, new SEQUENCE, a fresh invitation', async () => {
    const patientId = annex.patientIds[patient++]!
    await testDb()('patients').where({ id: patientId }).update({ email: `undo-${patientId}@fernhollow.test`, email_consent: true })
    const visit = await book(startIn(3 * 60), { operatoryIndex: 2, patientIndex: annex.patientIds.indexOf(patientId) })
    const cancelled = await admin.post(`/api/visits/${visit.id}/cancel`, { reason: 'Patient called', rowVersion: visit.rowVersion })
    expect(cancelled.status).toBe(200)
    expect(await segmentCount(visit.id)).toBe(0)
    const undone = await undo(admin, cancelled.body)
    expect(undone.status, JSON.stringify(undone.body)).toBe(200)
    expect(undone.body).toMatchObject({ state: 'booked', cancelReason: null })
    expect(undone.body.icalSequence).toBe(cancelled.body.icalSequence + 1)
    expect(await segmentCount(visit.id)).toBeGreaterThan(0)
    const kinds = await testDb()('outbox').where({ visit_id: visit.id }).orderBy('id').pluck('kind')
    expect(kinds.filter((kind: string) => kind !== 'reminder')).toEqual(['invitation', 'cancellation', 'invitation'])
  })

  it('a cancellation is not undone by the visit\'s provider (403), nor once another visit took the provider: 409', async () => {
    const visit = await book(startIn(4 * 60), { operatoryIndex: 3 })
    const cancelled = await admin.post(`/api/visits/${visit.id}/cancel`, { reason: 'Patient called', rowVersion: visit.rowVersion })
    const byProvider = await undo(ownProvider, cancelled.body)
    expect(byProvider.status).toBe(403)
    expect(byProvider.body.message).toBe('Only the front desk, managers and admins of this site may undo a cancellation.')
    const taker = await book(visit.startUtc, { operatoryIndex: 0 })
    const refused = await undo(admin, cancelled.body)
    expect(refused.status).toBe(409)
    expect(refused.body.message).toMatch(/cannot be undone: Dr\. Annex .+ is already working with another patient from /)
    expect(refused.body.data.conflict).toMatchObject({ resource: 'provider', visitId: taker.id })
    expect((await testDb()('visits').where({ id: visit.id }).first('state')).state).toBe('cancelled')
  })
})
