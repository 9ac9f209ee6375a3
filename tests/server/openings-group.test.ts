// Openings across the whole group (issue 14, "Openings that help choose"): a front desk may search
// every site for the patient's convenience; sites outside their scope come back marked `inScope: false`,
// and booking there still follows their scope (403). Two test annexes of their own, any week.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient } from '../helpers/api-client'
import { closeTestDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { createStaff, STAFF_PASSWORD } from '../helpers/midday'
import { daysFromToday } from '../helpers/dates'

let own: Annex
let other: Annex
let desk: ApiClient

beforeAll(async () => {
  own = await createAnnex({ rooms: 1, providers: 1, patients: 1 })
  other = await createAnnex({ rooms: 1, providers: 1, patients: 0 })
  const staff = await createStaff('front_desk', [own.siteId])
  desk = new ApiClient()
  await desk.signIn(staff.email, STAFF_PASSWORD)
})
afterAll(closeTestDb)

const day = () => daysFromToday(5, own.timeZone)

describe('POST /api/openings with wholeGroup', () => {
  it('refuses another site without wholeGroup (403), as before', async () => {
    const response = await desk.post('/api/openings', { items: FILLING, from: day(), to: day(), siteIds: [own.siteId, other.siteId], limit: 20 })
    expect(response.status).toBe(403)
  })

  it('finds openings at a site outside the desk\'s scope, marked, and booking there is refused (403)', async () => {
    const response = await desk.post('/api/openings', { items: FILLING, from: day(), to: day(), siteIds: [own.siteId, other.siteId], wholeGroup: true, limit: 400 })
    expect(response.status, JSON.stringify(response.body)).toBe(200)
    const openings = response.body.openings as Array<{ siteId: number; inScope: boolean; operatoryId: number; providerId: number; startUtc: string }>
    const mine = openings.filter((opening) => opening.siteId === own.siteId)
    const theirs = openings.filter((opening) => opening.siteId === other.siteId)
    expect(mine.length).toBeGreaterThan(0)
    expect(theirs.length).toBeGreaterThan(0)
    expect(mine.every((opening) => opening.inScope)).toBe(true)
    expect(theirs.every((opening) => !opening.inScope)).toBe(true)
    const first = theirs[0]!
    const booked = await desk.post('/api/visits', {
      patientId: own.patientIds[0], siteId: other.siteId, operatoryId: first.operatoryId, providerId: first.providerId, startUtc: first.startUtc, items: FILLING,
    })
    expect(booked.status).toBe(403)
  })

  it('says a wrong wholeGroup in words (400)', async () => {
    const response = await desk.post('/api/openings', { items: FILLING, from: day(), to: day(), wholeGroup: 'yes' })
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe('wholeGroup')
  })
})
