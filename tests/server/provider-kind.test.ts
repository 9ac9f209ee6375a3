// A provider's kind is its account's role (one source, migration 20261203120100), and the provider row
// follows role changes: deactivated when the role stops being a provider role, refused (409 naming the
// visits) while the provider still has open visits ahead, reactivated when the role comes back.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedInAs, type ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { atAhead, MONDAY } from '../helpers/dates'

let admin: ApiClient

beforeAll(async () => {
  admin = await signedInAs('admin@fernhollow.test')
})
afterAll(closeTestDb)

async function userOfProvider(providerId: number): Promise<number> {
  const row = await testDb()('providers').where({ id: providerId }).first('user_id')
  return row.user_id as number
}

async function listed(annex: Annex) {
  const response = await admin.get(`/api/providers?siteId=${annex.siteId}`)
  expect(response.status).toBe(200)
  return response.body as Array<{ id: number; kind: string; active: boolean }>
}

describe('provider kind from the role', () => {
  it('has no kind column on providers', async () => {
    expect(Object.keys(await testDb()('providers').columnInfo())).not.toContain('kind')
  })

  it('reads the kind from the role: a dentist changed to hygienist is listed as a hygienist', async () => {
    const annex = await createAnnex({ rooms: 1, patients: 0 })
    const providerId = annex.providerIds[0]!
    expect(await listed(annex)).toEqual([expect.objectContaining({ id: providerId, kind: 'dentist', active: true })])
    const changed = await admin.patch(`/api/users/${await userOfProvider(providerId)}`, { role: 'hygienist' })
    expect(changed.status).toBe(200)
    expect(changed.body).toMatchObject({ role: 'hygienist', providerId })
    expect(await listed(annex)).toEqual([expect.objectContaining({ id: providerId, kind: 'hygienist', active: true })])
  })

  it('deactivates the provider when the role stops being a provider role, and reactivates it when it comes back', async () => {
    const annex = await createAnnex({ rooms: 1, patients: 0 })
    const providerId = annex.providerIds[0]!
    const userId = await userOfProvider(providerId)

    const desk = await admin.patch(`/api/users/${userId}`, { role: 'front_desk' })
    expect(desk.status).toBe(200)
    expect(desk.body).toMatchObject({ role: 'front_desk', providerId: null })
    expect(await listed(annex)).toEqual([])
    expect((await testDb()('providers').where({ id: providerId }).first('active')).active).toBe(0)
    const booking = await admin.post('/api/visits', { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId, patientId: 1, startUtc: atAhead(3, MONDAY, '09:00', annex.timeZone), items: FILLING })
    expect(booking.status).toBe(400)
    expect(booking.body.data).toMatchObject({ field: 'providerId' })

    const back = await admin.patch(`/api/users/${userId}`, { role: 'dentist' })
    expect(back.status).toBe(200)
    expect(back.body).toMatchObject({ role: 'dentist', providerId })
    expect(await listed(annex)).toEqual([expect.objectContaining({ id: providerId, kind: 'dentist', active: true })])
  })

  it('refuses with 409 naming the visits while the provider has open visits ahead, then allows it once they are cancelled', async () => {
    const annex = await createAnnex({ rooms: 1, patients: 1 })
    const providerId = annex.providerIds[0]!
    const userId = await userOfProvider(providerId)
    const booked = await admin.post('/api/visits', {
      siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId, patientId: annex.patientIds[0],
      startUtc: atAhead(2, MONDAY, '09:00', annex.timeZone), items: FILLING,
    })
    expect(booked.status).toBe(201)

    const refused = await admin.patch(`/api/users/${userId}`, { role: 'assistant' })
    expect(refused.status).toBe(409)
    expect(refused.body.data).toMatchObject({ field: 'role', visitIds: [booked.body.id] })
    expect(refused.body.message).toContain(`visit ${booked.body.id}`)
    expect(refused.body.message).toContain('1 open visit')
    const unchanged = await admin.get('/api/users')
    expect(unchanged.body.find((account: { id: number }) => account.id === userId)).toMatchObject({ role: 'dentist', providerId })
    expect(await listed(annex)).toEqual([expect.objectContaining({ id: providerId, active: true })])

    const cancelled = await admin.post(`/api/visits/${booked.body.id}/cancel`, { reason: 'Provider leaves the chair' })
    expect(cancelled.status).toBe(200)
    const allowed = await admin.patch(`/api/users/${userId}`, { role: 'assistant' })
    expect(allowed.status).toBe(200)
    expect(allowed.body).toMatchObject({ role: 'assistant', providerId: null })
  })

  it('makes only a dentist or hygienist a provider (POST /api/providers)', async () => {
    const annex = await createAnnex({ rooms: 1, patients: 0 })
    const userId = await userOfProvider(annex.providerIds[0]!)
    const already = await admin.post('/api/providers', { userId, colour: '#334155', capabilities: ['restorative'] })
    expect(already.status).toBe(409)
    const desk = await admin.get('/api/users')
    const frontDesk = desk.body.find((account: { email: string }) => account.email === 'desk.aspen@fernhollow.test')
    const refused = await admin.post('/api/providers', { userId: frontDesk.id, colour: '#334155', capabilities: ['restorative'] })
    expect(refused.status).toBe(400)
    expect(refused.body.data).toMatchObject({ field: 'userId' })
  })
})
