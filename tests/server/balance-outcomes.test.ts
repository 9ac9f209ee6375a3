// GET /api/balance: no-show and late-cancellation rates per site, and days with nobody on shift left
// out of the chairs' open hours (issue 14). Late means cancelled less than LATE_CANCEL_HOURS (24)
// before the start: our own definition (common practice, no source), in DEVELOPERS.md.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedInAs, type ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt, type Annex } from '../helpers/booking-fixtures'
import { daysFromToday, plusDays, weekdayAhead, WEDNESDAY } from '../helpers/dates'

const H = 3_600_000
let manager: ApiClient
let annex: Annex

beforeAll(async () => {
  manager = await signedInAs('manager@fernhollow.test')
  annex = await createAnnex({ rooms: 1, providers: 1, patients: 4 })
})
afterAll(closeTestDb)

describe('visit outcomes on Balance', () => {
  it('counts missed among the visits that were due, and late cancellations among all', async () => {
    // Book four visits ahead (the only way the API books), cancel two, then move them all into a past
    // day in the database, as if that day had happened.
    const ahead = weekdayAhead(5, WEDNESDAY, annex.timeZone)
    const past = daysFromToday(-3, annex.timeZone)
    const ids: number[] = []
    for (const [index, time] of ['09:00', '10:30', '12:00', '13:30'].entries()) {
      const booked = await manager.post('/api/visits', {
        siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[index],
        startUtc: utcAt(`${ahead}T${time}`, annex.timeZone), items: FILLING,
      })
      expect(booked.status).toBe(201)
      ids.push(booked.body.id)
    }
    for (const id of ids.slice(2)) expect((await manager.post(`/api/visits/${id}/cancel`, { reason: 'Patient called' })).status).toBe(200)
    const db = testDb()
    const shiftMs = Date.parse(`${ahead}T00:00:00Z`) - Date.parse(`${past}T00:00:00Z`)
    for (const [index, id] of ids.entries()) {
      const row = await db('visits').where({ id }).first()
      const startMs = row.start_utc.getTime() - shiftMs
      await db('visits').where({ id }).update({ start_utc: new Date(startMs), end_utc: new Date(row.end_utc.getTime() - shiftMs), ...(index === 0 ? { state: 'finished' } : index === 1 ? { state: 'missed' } : {}) })
      // The third was cancelled 2 hours before its start (late), the fourth two days before (not late).
      if (index >= 2) {
        await db('audit_log').where({ entity: 'visit', entity_id: String(id), action: 'visit_cancelled' })
          .update({ created_at: new Date(startMs - (index === 2 ? 2 : 48) * H) })
      }
    }
    const response = await manager.get(`/api/balance?from=${past}&to=${past}&siteId=${annex.siteId}`)
    expect(response.status).toBe(200)
    expect(response.body.lateCancelHours).toBe(24)
    expect(response.body.sites[0].outcomes).toEqual({ visits: 4, due: 2, missed: 1, missedRate: 0.5, cancelled: 2, lateCancelled: 1, lateCancelRate: 0.25 })
  })

  it('leaves a day with nobody on shift out of the open hours and marks it', async () => {
    const day = weekdayAhead(6, WEDNESDAY, annex.timeZone)
    const off = plusDays(day, 1)
    await testDb()('shift_exceptions').insert({ provider_id: annex.providerIds[0], site_id: null, kind: 'time_off', start_date: off, end_date: off, reason: 'Away' })
    const response = await manager.get(`/api/balance?from=${day}&to=${off}&siteId=${annex.siteId}`)
    expect(response.status).toBe(200)
    const [staffed, unstaffed] = response.body.sites[0].days
    expect(staffed).toMatchObject({ date: day, nobodyOnShift: false })
    expect(staffed.availableMinutes).toBeGreaterThanOrEqual(23 * 60)
    expect(unstaffed).toMatchObject({ date: off, nobodyOnShift: true, availableMinutes: 0, share: null, band: null })
    // One chair open around the clock both days, but counted only for the staffed day.
    expect(response.body.sites[0].chairs.availableMinutes).toBe(staffed.availableMinutes)
  })
})
