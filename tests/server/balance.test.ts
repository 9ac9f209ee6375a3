// GET /api/balance over HTTP: who may ask, what is refused, and figures that add up to the visits
// actually booked (chair held for every segment, provider busy for hands-on only).
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt, type Annex } from '../helpers/booking-fixtures'
import { weekdayAhead, plusDays, MONDAY } from '../helpers/dates'

const DAY = weekdayAhead(10, MONDAY) // this file's own week
let manager: ApiClient
let annex: Annex

function minutesOf(segments: Array<{ kind: string; startUtc: string; endUtc: string }>, kinds?: string[]): number {
  return segments.filter((segment) => !kinds || kinds.includes(segment.kind))
    .reduce((sum, segment) => sum + (Date.parse(segment.endUtc) - Date.parse(segment.startUtc)) / 60_000, 0)
}

beforeAll(async () => {
  manager = await signedInAs('manager@fernhollow.test')
  annex = await createAnnex({ rooms: 2, providers: 1, patients: 2 })
})
afterAll(closeTestDb)

describe('balance', () => {
  it('answers 401 signed out and 403 for the front desk', async () => {
    const anonymous = new ApiClient(inject('baseURL'))
    expect((await anonymous.get(`/api/balance?from=${DAY}&to=${DAY}`)).status).toBe(401)
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    expect((await desk.get(`/api/balance?from=${DAY}&to=${DAY}`)).status).toBe(403)
  })

  it.each([
    ['an end before the start', `from=${DAY}&to=${plusDays(DAY, -1)}`, 'to'],
    ['more than 31 days', `from=${DAY}&to=${plusDays(DAY, 31)}`, 'to'],
    ['a date that is not one', 'from=2027-02-30&to=2027-03-01', 'from'],
    ['a quiet threshold above the tight one', `from=${DAY}&to=${DAY}&quietBelow=0.9&tightFrom=0.5`, 'quietBelow'],
    ['a share above 1', `from=${DAY}&to=${DAY}&tightFrom=1.5`, 'tightFrom'],
  ])('answers %s with 400 naming the field', async (_case, query, field) => {
    const response = await manager.get(`/api/balance?${query}`)
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe(field)
  })

  it('adds up to the booked visit: the chair for all of it, the provider for hands-on work', async () => {
    const booked = await manager.post('/api/visits', {
      siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[0],
      startUtc: utcAt(`${DAY}T09:00`, annex.timeZone), items: FILLING,
    })
    expect(booked.status).toBe(201)
    const response = await manager.get(`/api/balance?from=${DAY}&to=${DAY}&siteId=${annex.siteId}`)
    expect(response.status).toBe(200)
    expect(response.body.sites).toHaveLength(1)
    const site = response.body.sites[0]
    // The annex is open around the clock: 1,440 minutes per chair on one local day.
    const [used, free] = site.operatories
    expect(used).toMatchObject({ id: annex.operatoryIds[0], availableMinutes: 1440, usedMinutes: minutesOf(booked.body.segments), band: 'quiet' })
    expect(free).toMatchObject({ id: annex.operatoryIds[1], availableMinutes: 1440, usedMinutes: 0, share: 0 })
    expect(site.providers[0]).toMatchObject({ id: annex.providerIds[0], availableMinutes: 1440, usedMinutes: minutesOf(booked.body.segments, ['hands_on']) })
    expect(minutesOf(booked.body.segments, ['hands_on'])).toBeLessThan(minutesOf(booked.body.segments))
    expect(site.chairs).toMatchObject({ availableMinutes: 2880, usedMinutes: minutesOf(booked.body.segments) })
    expect(site.days).toEqual([{ date: DAY, ...site.chairs, nobodyOnShift: false }])
  })

  it('gives every site in the manager\'s scope when no site is named, with the thresholds used', async () => {
    const response = await manager.get(`/api/balance?from=${DAY}&to=${plusDays(DAY, 6)}&quietBelow=0.3&tightFrom=0.8`)
    expect(response.status).toBe(200)
    expect(response.body.thresholds).toEqual({ quietBelow: 0.3, tightFrom: 0.8 })
    const names = response.body.sites.map((site: { siteName: string }) => site.siteName)
    expect(names).toEqual(expect.arrayContaining(['Fernhollow Quarry Street', 'Fernhollow Aspen Gulch', 'Fernhollow Saguaro Flats']))
    const quarry = response.body.sites.find((site: { siteName: string }) => site.siteName === 'Fernhollow Quarry Street')
    // Quarry Street has five rooms and is open on weekdays (the demo's opening hours).
    expect(quarry.operatories).toHaveLength(5)
    expect(quarry.chairs.availableMinutes).toBeGreaterThan(0)
    // Day by day, Monday to Sunday: Quarry Street is closed on Sundays (no share).
    expect(quarry.days.map((day: { date: string }) => day.date)).toEqual([0, 1, 2, 3, 4, 5, 6].map((days) => plusDays(DAY, days)))
    expect(quarry.days.at(-1)).toMatchObject({ availableMinutes: 0, share: null })
    const total = quarry.days.reduce((sum: number, day: { availableMinutes: number }) => sum + day.availableMinutes, 0)
    expect(Math.abs(total - quarry.chairs.availableMinutes)).toBeLessThanOrEqual(quarry.days.length)
  })
})
