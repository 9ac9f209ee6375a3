// Openings over HTTP: what the search offers can be booked, on the site's local grid.
import { afterAll, describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'
import { FILLING } from '../helpers/booking-fixtures'
import { weekdayAhead, plusDays, MONDAY, WEDNESDAY, SUNDAY } from '../helpers/dates'

afterAll(closeTestDb)

// Week 7 ahead is this file's own, so no other test's visits change what the search offers.
const MONDAY_7 = weekdayAhead(7, MONDAY)
const WEDNESDAY_7 = weekdayAhead(7, WEDNESDAY)

describe('POST /api/openings', () => {
  it('offers fillings at Quarry Street on the 5-minute local grid, and the first one books', async () => {
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    const quarry = await siteIdBySlug('quarry-street')
    const response = await desk.post('/api/openings', { items: FILLING, from: MONDAY_7, to: plusDays(MONDAY_7, 1), limit: 20 })
    expect(response.status).toBe(200)
    expect(response.body.openings.length).toBe(20)
    for (const opening of response.body.openings) {
      expect(opening.siteId).toBe(quarry)
      expect(opening.timeZone).toBe('America/Los_Angeles')
      const local = DateTime.fromISO(opening.startUtc, { zone: 'America/Los_Angeles' })
      expect(local.minute % 5).toBe(0)
      expect(opening.startLocalIso).toBe(local.toISO({ suppressMilliseconds: true }))
    }
    const starts = response.body.openings.map((opening: { startUtc: string }) => opening.startUtc)
    expect([...starts].sort()).toEqual(starts)

    const patient = await testDb()('patients').whereNull('merged_into_id').orderBy('id', 'desc').first('id') // a live record (another file may have just merged one away)
    const first = response.body.openings[0]
    const booked = await desk.post('/api/visits', {
      patientId: patient.id, siteId: first.siteId, operatoryId: first.operatoryId, providerId: first.providerId, startUtc: first.startUtc, items: FILLING,
    })
    expect(booked.status).toBe(201)
    const again = await desk.post('/api/openings', { items: FILLING, from: MONDAY_7, to: plusDays(MONDAY_7, 1), limit: 20 })
    expect(again.body.openings.some((opening: { operatoryId: number; startUtc: string }) => opening.operatoryId === first.operatoryId && opening.startUtc === first.startUtc)).toBe(false)
  })

  it('searches every site in a manager\'s scope', async () => {
    const manager = await signedInAs('manager@fernhollow.test')
    // The three demo sites by id: other test files add always-open test sites to the manager's scope.
    const siteIds = await Promise.all(['quarry-street', 'aspen-gulch', 'saguaro-flats'].map(siteIdBySlug))
    const response = await manager.post('/api/openings', { items: FILLING, siteIds, from: WEDNESDAY_7, to: plusDays(WEDNESDAY_7, 2), limit: 300 })
    const zones = new Set(response.body.openings.map((opening: { timeZone: string }) => opening.timeZone))
    expect(zones).toEqual(new Set(['America/Los_Angeles', 'America/Denver', 'America/Phoenix']))
  })

  it('explains in plain words when nothing fits', async () => {
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    const response = await desk.post('/api/openings', { items: FILLING, from: weekdayAhead(7, SUNDAY), to: weekdayAhead(7, SUNDAY) }) // a Sunday: closed
    expect(response.status).toBe(200)
    expect(response.body.openings).toEqual([])
    expect(response.body.reasons.length).toBeGreaterThan(0)
  })

  it('answers 400 naming the field and 403 outside the scope', async () => {
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    const backwards = await desk.post('/api/openings', { items: FILLING, from: WEDNESDAY_7, to: plusDays(WEDNESDAY_7, -9) })
    expect(backwards.status).toBe(400)
    expect(backwards.body.data.field).toBe('to')
    const badDate = await desk.post('/api/openings', { items: FILLING, from: 'soon', to: WEDNESDAY_7 })
    expect(badDate.body.data.field).toBe('from')
    const aspen = await siteIdBySlug('aspen-gulch')
    expect((await desk.post('/api/openings', { items: FILLING, siteIds: [aspen], from: WEDNESDAY_7, to: plusDays(WEDNESDAY_7, 1) })).status).toBe(403)
  })
})
