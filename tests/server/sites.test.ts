// Sites and rooms over HTTP: shapes kept for existing callers, validation, permissions, conflicts.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, siteIdBySlug } from '../helpers/db'
import { demoClosedDates } from '../../seeds/01-sites'

const HOURS = { '1': [{ start: '08:00', end: '17:00' }], '2': [], '3': [], '4': [], '5': [], '6': [], '7': [] }
let admin: ApiClient
let manager: ApiClient
let desk: ApiClient

beforeAll(async () => {
  admin = await signedInAs('admin@fernhollow.test')
  manager = await signedInAs('manager@fernhollow.test')
  desk = await signedInAs('desk.quarry@fernhollow.test')
})
afterAll(closeTestDb)

// Throwaway sites have slugs starting test- so the seed check in migrations.test.ts skips them.
function siteBody(overrides: Record<string, unknown> = {}) {
  const tag = randomUUID().slice(0, 8)
  return { name: `Test site ${tag}`, slug: `test-${tag}`, timeZone: 'America/Chicago', openingHours: HOURS, ...overrides }
}

describe('sites', () => {
  it('keeps the summary fields of GET /api/sites and /api/sites/:id', async () => {
    const list = await desk.get('/api/sites')
    expect(list.status).toBe(200)
    expect(list.body).toHaveLength(1)
    expect(list.body[0]).toMatchObject({ name: 'Fernhollow Quarry Street', slug: 'quarry-street', timeZone: 'America/Los_Angeles', colour: '#0f766e', bookingUnitMinutes: 5, toothNotation: 'universal' })
    const one = await desk.get(`/api/sites/${list.body[0].id}`)
    expect(one.body).toMatchObject({ id: list.body[0].id, address: '48 Quarry Street, Fernhollow', closedDates: demoClosedDates() })
    expect(one.body.openingHours['1']).toEqual([{ start: '07:30', end: '17:30' }])
  })

  it('lets an admin create a site with a slug made from its name', async () => {
    const name = `Test ${randomUUID().slice(0, 8)} Cedar Bend`
    const response = await admin.post('/api/sites', siteBody({ name, slug: undefined, bookingUnitMinutes: 15, closedDates: ['2026-07-03'] }))
    expect(response.status).toBe(201)
    expect(response.body).toMatchObject({ name, slug: name.toLowerCase().replace(/ /g, '-'), timeZone: 'America/Chicago', bookingUnitMinutes: 15, closedDates: ['2026-07-03'], active: true })
    const again = await admin.post('/api/sites', siteBody({ slug: response.body.slug }))
    expect(again.status).toBe(409)
    expect(again.body.data.field).toBe('slug')
  })

  it.each([
    ['a zone that is not in the IANA database', { timeZone: 'Mars/Olympus_Mons' }, 'timeZone', 'is not an IANA time zone such as America/Denver'],
    ['a booking unit of 7 minutes', { bookingUnitMinutes: 7 }, 'bookingUnitMinutes', 'must be 5, 10 or 15 minutes'],
    ['closing before opening', { openingHours: { ...HOURS, '2': [{ start: '17:00', end: '08:00' }] } }, 'openingHours.2.0.end', 'must be after the opening time'],
    ['a missing weekday', { openingHours: { '1': [] } }, 'openingHours.2', undefined],
    ['a closed date that does not exist', { closedDates: ['2026-13-01'] }, 'closedDates.0', 'is not a real calendar date'],
    ['a colour name', { colour: 'teal' }, 'colour', 'must be a colour such as #0f766e'],
    ['a bad e-mail', { email: 'front desk' }, 'email', undefined],
  ])('answers %s with a 400 naming the field', async (_case, overrides, field, reason) => {
    const response = await admin.post('/api/sites', siteBody(overrides))
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe(field)
    if (reason) expect(response.body.data.reason).toBe(reason)
  })

  it('lets an admin change the zone but not to a wrong one; managers may not change sites', async () => {
    const created = await admin.post('/api/sites', siteBody())
    const moved = await admin.patch(`/api/sites/${created.body.id}`, { timeZone: 'America/New_York', phone: '(555) 555-0101' })
    expect(moved.body).toMatchObject({ timeZone: 'America/New_York', phone: '(555) 555-0101' })
    const wrong = await admin.patch(`/api/sites/${created.body.id}`, { timeZone: 'Eastern' })
    expect(wrong.status).toBe(400)
    expect(wrong.body.data.field).toBe('timeZone')
    expect((await manager.patch(`/api/sites/${created.body.id}`, { name: 'Renamed' })).status).toBe(403)
    expect((await manager.post('/api/sites', siteBody())).status).toBe(403)
    expect((await new ApiClient().post('/api/sites', siteBody())).status).toBe(401)
  })

  it('keeps "late after" minutes per site: 10 by default, whole minutes 0–120 (issue 13 §3)', async () => {
    const created = await admin.post('/api/sites', siteBody())
    expect(created.body.lateAfterMinutes).toBe(10)
    const changed = await admin.patch(`/api/sites/${created.body.id}`, { lateAfterMinutes: 15 })
    expect(changed.status).toBe(200)
    expect(changed.body.lateAfterMinutes).toBe(15)
    for (const [value, reason] of [[121, 'must be at most 120 minutes'], [-1, 'cannot be negative'], [2.5, 'must be whole minutes']] as const) {
      const wrong = await admin.patch(`/api/sites/${created.body.id}`, { lateAfterMinutes: value })
      expect(wrong.status, String(value)).toBe(400)
      expect(wrong.body.data).toMatchObject({ field: 'lateAfterMinutes', reason })
    }
    // Every screen that marks visits late reads it from the site summary.
    const quarry = (await desk.get('/api/sites')).body[0]
    expect(quarry.lateAfterMinutes).toBe(10)
  })

  it('shows a front desk only its own site', async () => {
    const aspen = await siteIdBySlug('aspen-gulch')
    expect((await desk.get(`/api/sites/${aspen}`)).status).toBe(403)
  })
})

describe('operatories', () => {
  it('lets a manager add a room with capabilities at the end of the order', async () => {
    const aspen = await siteIdBySlug('aspen-gulch')
    const name = `Test chair ${randomUUID().slice(0, 4)}`
    const created = await manager.post('/api/operatories', { siteId: aspen, name, capabilities: ['restorative', 'imaging'] })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ siteId: aspen, name, capabilities: ['restorative', 'imaging'], active: true })
    const rooms = (await manager.get(`/api/operatories?siteId=${aspen}`)).body
    expect(rooms[rooms.length - 1]).toEqual({ id: created.body.id, siteId: aspen, name, capabilities: ['restorative', 'imaging'], active: true, sortOrder: created.body.sortOrder })

    const duplicate = await manager.post('/api/operatories', { siteId: aspen, name, capabilities: [] })
    expect(duplicate.status).toBe(409)
    const retired = await manager.patch(`/api/operatories/${created.body.id}`, { active: false })
    expect(retired.body.active).toBe(false)
  })

  it('names a capability that is not one of ours', async () => {
    const aspen = await siteIdBySlug('aspen-gulch')
    const response = await manager.post('/api/operatories', { siteId: aspen, name: 'Chair X', capabilities: ['laser'] })
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe('capabilities.0')
  })

  it('refuses front desk changing rooms', async () => {
    const quarry = await siteIdBySlug('quarry-street')
    const [room] = (await desk.get(`/api/operatories?siteId=${quarry}`)).body
    expect((await desk.patch(`/api/operatories/${room.id}`, { name: 'Mine now' })).status).toBe(403)
    expect((await desk.post('/api/operatories', { siteId: quarry, name: 'Chair 9', capabilities: [] })).status).toBe(403)
  })
})
