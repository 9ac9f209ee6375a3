// A site's clock and date order (issue 14): stored on the site, sent with every site summary, edited
// by admins; patient search reads a birth date in the screen's date order as well as ISO.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedInAs, type ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, type Annex } from '../helpers/booking-fixtures'

let admin: ApiClient
let annex: Annex
let patientId: number

beforeAll(async () => {
  admin = await signedInAs('admin@fernhollow.test')
  annex = await createAnnex({ rooms: 1, patients: 1 })
  patientId = annex.patientIds[0]!
  // A birth date no demo patient has (the demo's are generated between 1940 and 2020).
  await testDb()('patients').where({ id: patientId }).update({ date_of_birth: '1903-09-13' })
})
afterAll(closeTestDb)

describe('site display style', () => {
  it('defaults to a 12-hour clock and month-day-year, and the demo shows a 24-hour site too', async () => {
    const sites = (await admin.get('/api/sites')).body as Array<{ id: number; slug: string; clock: string; dateOrder: string }>
    expect(sites.find((site) => site.id === annex.siteId)).toMatchObject({ clock: '12h', dateOrder: 'month-day-year' })
    expect(sites.find((site) => site.slug === 'quarry-street')).toMatchObject({ clock: '12h', dateOrder: 'month-day-year' })
    expect(sites.find((site) => site.slug === 'aspen-gulch')).toMatchObject({ clock: '24h' })
  })

  it('lets an admin change both, and /api/me carries them to every screen', async () => {
    const changed = await admin.patch(`/api/sites/${annex.siteId}`, { clock: '24h', dateOrder: 'day-month-year' })
    expect(changed.status).toBe(200)
    expect(changed.body).toMatchObject({ clock: '24h', dateOrder: 'day-month-year' })
    const me = (await admin.get('/api/me')).body as { sites: Array<{ id: number; clock: string; dateOrder: string }> }
    expect(me.sites.find((site) => site.id === annex.siteId)).toMatchObject({ clock: '24h', dateOrder: 'day-month-year' })
  })

  it.each([
    ['clock', { clock: '13h' }, 'must be 12h or 24h'],
    ['dateOrder', { dateOrder: 'day-year-month' }, 'must be one of month-day-year, day-month-year, year-month-day'],
  ])('refuses a wrong %s with 400 naming it', async (field, body, reason) => {
    const response = await admin.patch(`/api/sites/${annex.siteId}`, body)
    expect(response.status).toBe(400)
    expect(response.body.data).toMatchObject({ field, reason })
  })
})

describe('patient search by birth date', () => {
  const ids = (body: Array<{ id: number }>) => body.map((patient) => patient.id)

  it('finds "09/13/1903" (month first, the default) as well as "1903-09-13"', async () => {
    expect(ids((await admin.get('/api/patients?q=1903-09-13')).body)).toContain(patientId)
    expect(ids((await admin.get(`/api/patients?q=${encodeURIComponent('09/13/1903')}`)).body)).toContain(patientId)
    expect(ids((await admin.get(`/api/patients?q=${encodeURIComponent('9/13/1903')}`)).body)).toContain(patientId)
  })

  it('reads the date in the order the screen sends', async () => {
    expect(ids((await admin.get(`/api/patients?q=${encodeURIComponent('13/09/1903')}&dateOrder=day-month-year`)).body)).toContain(patientId)
    expect(ids((await admin.get(`/api/patients?q=${encodeURIComponent('13/09/1903')}`)).body)).not.toContain(patientId)
    const wrong = await admin.get('/api/patients?q=1903-09-13&dateOrder=sideways')
    expect(wrong.status).toBe(400)
    expect(wrong.body.data.field).toBe('dateOrder')
  })
})
