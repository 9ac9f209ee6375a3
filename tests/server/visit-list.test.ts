// The visit list behind the Chairboard and My day, with ETag polling.
import { afterAll, describe, expect, it } from 'vitest'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'
import { FILLING, utcAt } from '../helpers/booking-fixtures'
import { weekdayAhead, plusDays, MONDAY } from '../helpers/dates'

afterAll(closeTestDb)

const DAY = weekdayAhead(8, MONDAY, 'America/Los_Angeles') // a Monday: the demo dentist is at Quarry Street

describe('GET /api/visits', () => {
  it('lists a site day with names, procedures and segments, and answers 304 while nothing changed', async () => {
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    const quarry = await siteIdBySlug('quarry-street')
    const chair = await testDb()('operatories').where({ site_id: quarry, name: 'Chair 2' }).first('id')
    const dentist = await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('users.email', 'dentist@fernhollow.test').first('providers.id')
    const patient = await testDb()('patients').orderBy('id').offset(60).first('id', 'first_name', 'last_name')
    const from = utcAt(`${DAY}T00:00`, 'America/Los_Angeles')
    const to = utcAt(`${plusDays(DAY, 1)}T00:00`, 'America/Los_Angeles')
    const path = `/api/visits?siteId=${quarry}&fromUtc=${encodeURIComponent(from)}&toUtc=${encodeURIComponent(to)}`

    const empty = await desk.get(path)
    expect(empty.status).toBe(200)
    const etag = empty.headers.get('etag')!
    expect((await desk.get(path, { headers: { 'if-none-match': etag } })).status).toBe(304)

    const booked = await desk.post('/api/visits', { patientId: patient.id, siteId: quarry, operatoryId: chair.id, providerId: dentist.id, startUtc: utcAt(`${DAY}T10:00`, 'America/Los_Angeles'), items: FILLING })
    expect(booked.status).toBe(201)
    const after = await desk.get(path, { headers: { 'if-none-match': etag } })
    expect(after.status).toBe(200)
    const visit = after.body.find((entry: { id: number }) => entry.id === booked.body.id)
    expect(visit).toMatchObject({ patientName: `${patient.first_name} ${patient.last_name}`, procedures: ['Posterior composite 19 MO'] })
    expect(visit.providerInitials).toMatch(/^[A-Z]{2,3}$/)
    expect(visit.segments.some((segment: { kind: string }) => segment.kind === 'numbing')).toBe(true)

    // The Patients screen asks by patient.
    const byPatient = await desk.get(`/api/visits?patientId=${patient.id}&fromUtc=${encodeURIComponent(from)}&toUtc=${encodeURIComponent(to)}`)
    expect(byPatient.body.map((entry: { id: number }) => entry.id)).toEqual([booked.body.id])
  })

  it('answers 400 naming the field and 403 for another site', async () => {
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    const missing = await desk.get(`/api/visits?fromUtc=${DAY}T00:00:00Z&toUtc=${plusDays(DAY, 1)}T00:00:00Z`)
    expect(missing.status).toBe(400)
    expect(missing.body.data.field).toBe('siteId')
    const aspen = await siteIdBySlug('aspen-gulch')
    expect((await desk.get(`/api/visits?siteId=${aspen}&fromUtc=${DAY}T00:00:00Z&toUtc=${plusDays(DAY, 1)}T00:00:00Z`)).status).toBe(403)
  })
})
