// Shifts, exceptions, blocks and availability over HTTP against the built server and real MariaDB.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, createTestUser, siteIdBySlug, testDb } from '../helpers/db'
import { createTestProvider, providerIdByEmail } from '../helpers/rota'
import type { SiteSummary } from '../../shared/types/auth'
import { displayStyleOf, formatLocalDate } from '../../shared/utils/display-time'

let quarry: number
let aspen: number
let saguaro: number
let manager: ApiClient
let deskQuarry: ApiClient

beforeAll(async () => {
  quarry = await siteIdBySlug('quarry-street')
  aspen = await siteIdBySlug('aspen-gulch')
  saguaro = await siteIdBySlug('saguaro-flats')
  manager = await signedInAs('manager@fernhollow.test')
  deskQuarry = await signedInAs('desk.quarry@fernhollow.test')
})
afterAll(closeTestDb)

function shiftBody(providerId: number, overrides: Record<string, unknown> = {}) {
  return { providerId, siteId: aspen, rrule: 'FREQ=WEEKLY;BYDAY=TU,TH', validFrom: '2026-03-02', localStart: '07:30', localEnd: '16:00', ...overrides }
}

describe('shifts: permissions', () => {
  it('answers a signed-out caller with 401 before looking at the body', async () => {
    expect((await new ApiClient().post('/api/shifts', {})).status).toBe(401)
  })

  it('refuses front desk creating a shift with 403', async () => {
    const provider = await createTestProvider(['quarry-street'])
    const response = await deskQuarry.post('/api/shifts', shiftBody(provider.providerId, { siteId: quarry }))
    expect(response.status).toBe(403)
  })

  it('lets a manager create, read, change and delete a shift, with the rule in words', async () => {
    const provider = await createTestProvider(['aspen-gulch'])
    const created = await manager.post('/api/shifts', shiftBody(provider.providerId))
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ siteId: aspen, rrule: 'FREQ=WEEKLY;BYDAY=TU,TH', validUntil: null, ruleText: 'every Tuesday and Thursday', localStart: '07:30' })

    const changed = await manager.patch(`/api/shifts/${created.body.id}`, { rrule: 'FREQ=WEEKLY;INTERVAL=2;BYDAY=FR', validUntil: '2026-06-30' })
    expect(changed.status).toBe(200)
    expect(changed.body).toMatchObject({ ruleText: 'every other Friday', validUntil: '2026-06-30', validFrom: '2026-03-02' })

    const listed = await manager.get(`/api/shifts?providerId=${provider.providerId}`)
    expect(listed.body.map((shift: { id: number }) => shift.id)).toEqual([created.body.id])

    expect((await manager.delete(`/api/shifts/${created.body.id}`)).status).toBe(200)
    expect((await manager.get(`/api/shifts/${created.body.id}`)).status).toBe(404)
  })

  it('lets a manager of one site change only that site\'s rota', async () => {
    const scoped = await createTestUser({ role: 'manager', siteSlugs: ['quarry-street'] })
    const client = new ApiClient()
    await client.signIn(scoped.email, scoped.password)
    const provider = await createTestProvider(['quarry-street', 'aspen-gulch'])
    expect((await client.post('/api/shifts', shiftBody(provider.providerId))).status).toBe(403)
    const mine = await client.post('/api/shifts', shiftBody(provider.providerId, { siteId: quarry, validUntil: '2026-03-31' }))
    expect(mine.status).toBe(201)
    expect((await client.patch(`/api/shifts/${mine.body.id}`, { siteId: aspen })).status).toBe(403)
    // Time off at every site touches Aspen Gulch too, which this manager does not keep.
    const everywhere = await client.post('/api/shift-exceptions', { providerId: provider.providerId, kind: 'time_off', startDate: '2026-03-10', endDate: '2026-03-10' })
    expect(everywhere.status).toBe(403)
  })

  it('refuses a front desk reading another site\'s rota with 403', async () => {
    expect((await deskQuarry.get(`/api/shifts?siteId=${aspen}`)).status).toBe(403)
    expect((await deskQuarry.get(`/api/availability?siteId=${aspen}&from=2026-02-02&to=2026-02-02`)).status).toBe(403)
    expect((await deskQuarry.get(`/api/rota?siteId=${aspen}&from=2026-02-02&to=2026-02-08`)).status).toBe(403)
    expect((await deskQuarry.get(`/api/shifts?siteId=${quarry}`)).status).toBe(200)
  })
})

describe('shifts: validation', () => {
  let providerId: number
  beforeAll(async () => { providerId = (await createTestProvider(['aspen-gulch'])).providerId })

  it.each([
    ['a time without two digits', { localStart: '7:30' }, 'localStart', 'must be a time such as 07:30 (HH:mm, 24-hour)'],
    ['an hour past 23', { localEnd: '25:00' }, 'localEnd', 'must be a time such as 16:00 (HH:mm, 24-hour)'],
    ['an end before the start', { localStart: '16:00', localEnd: '07:30' }, 'localEnd', 'must be after the start time'],
    ['a date that does not exist', { validFrom: '2026-02-30' }, 'validFrom', 'is not a real calendar date'],
    ['an until before the start', { validUntil: '2026-01-01' }, 'validUntil', 'must not be before the first day (validFrom)'],
    ['an hourly rule', { rrule: 'FREQ=HOURLY' }, 'rrule', 'Repeating more often than daily is not supported; a shift sets its own hours.'],
    ['a rule that is not RRULE', { rrule: 'every monday' }, 'rrule', undefined],
    ['a missing provider', { providerId: undefined }, 'providerId', undefined],
  ])('answers %s with a 400 naming the field', async (_case, overrides, field, reason) => {
    const response = await manager.post('/api/shifts', shiftBody(providerId, overrides))
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe(field)
    if (reason) expect(response.body.data.reason).toBe(reason)
  })

  it('answers an unknown provider with a 400 on providerId, never a 500', async () => {
    const response = await manager.post('/api/shifts', shiftBody(999_999))
    expect(response.status).toBe(400)
    expect(response.body.data).toMatchObject({ field: 'providerId', reason: 'is not a provider' })
  })

  it('refuses a shift or extra day at a site the provider\'s account does not include, saying what to do', async () => {
    const response = await manager.post('/api/shifts', shiftBody(providerId, { siteId: saguaro }))
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe('providerId')
    expect(response.body.data.reason).toMatch(/does not include Fernhollow Saguaro Flats: add the site to their account under People first/)
    const extra = await manager.post('/api/shift-exceptions', { providerId, siteId: saguaro, kind: 'extra', startDate: '2026-03-07', endDate: '2026-03-07', localStart: '08:00', localEnd: '12:00' })
    expect(extra.status).toBe(400)
    expect(extra.body.data.field).toBe('providerId')
  })

  it('checks a PATCH merged with the stored shift (end before the stored start)', async () => {
    const created = await manager.post('/api/shifts', shiftBody(providerId, { rrule: 'FREQ=WEEKLY;BYDAY=MO', validUntil: '2026-03-31' }))
    const response = await manager.patch(`/api/shifts/${created.body.id}`, { localEnd: '07:00' })
    expect(response.status).toBe(400)
    expect(response.body.data).toMatchObject({ field: 'localEnd', reason: 'must be after the start time' })
  })
})

describe('shifts: one provider, one site at a time', () => {
  // A twin of the demo dentist (Quarry Street Mon, Tue, Thu 07:30–16:30; Saguaro Flats Wed, Fri
  // 07:00–15:00) whose account also covers Aspen Gulch, so shifts there may be tried.
  let twin: number
  beforeAll(async () => {
    twin = (await createTestProvider(['quarry-street', 'aspen-gulch', 'saguaro-flats'], 'Dr. Twin Provider')).providerId
    await testDb()('shifts').insert([
      { provider_id: twin, site_id: quarry, rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,TH', valid_from: '2026-01-05', local_start: '07:30', local_end: '16:30' },
      { provider_id: twin, site_id: saguaro, rrule: 'FREQ=WEEKLY;BYDAY=WE,FR', valid_from: '2026-01-05', local_start: '07:00', local_end: '15:00' },
    ])
  })

  it('answers an overlap with another site\'s shift with 409 naming the first clashing date', async () => {
    const dentist = twin
    // The dentist works Quarry Street (Los Angeles) Mon, Tue, Thu 07:30–16:30. Aspen Gulch
    // (Denver) 08:00–12:00 is 07:00–11:00 in Los Angeles: both zones change on 8 March 2026
    // (IANA tz database), so the first Monday from Wednesday 4 March, 9 March, clashes.
    const response = await manager.post('/api/shifts', shiftBody(dentist, { rrule: 'FREQ=WEEKLY;BYDAY=MO', validFrom: '2026-03-04', localStart: '08:00', localEnd: '12:00' }))
    expect(response.status).toBe(409)
    // The date reads in the order of the site the shift is for (Aspen Gulch's setting).
    const sites = (await manager.get('/api/sites')).body as SiteSummary[]
    const dateText = formatLocalDate('2026-03-09', displayStyleOf(sites.find((site) => site.id === aspen)), 'medium')
    expect(response.body.message).toMatch(new RegExp(`^Dr\\. .+ already works at Fernhollow Quarry Street on ${dateText} at that time\\.$`))
    expect(response.body.data).toMatchObject({ date: '2026-03-09', otherSiteId: quarry })
  })

  it('refuses an extra day at another site while the provider works elsewhere, and allows one on a free day', async () => {
    const dentist = twin
    // Monday 2026-03-09: the dentist is at Quarry Street 07:30–16:30 Los Angeles time.
    const clash = await manager.post('/api/shift-exceptions', { providerId: dentist, kind: 'extra', siteId: aspen, startDate: '2026-03-09', endDate: '2026-03-09', localStart: '09:00', localEnd: '12:00' })
    expect(clash.status).toBe(409)
    expect(clash.body.data).toMatchObject({ date: '2026-03-09', otherSiteId: quarry })
    // Saturday 2026-03-14: no shift anywhere.
    const free = await manager.post('/api/shift-exceptions', { providerId: dentist, kind: 'extra', siteId: aspen, startDate: '2026-03-14', endDate: '2026-03-14', localStart: '09:00', localEnd: '12:00' })
    expect(free.status).toBe(201)
  })

  it('finds a clash on the first matching date of an every-other-week rule across zones', async () => {
    const provider = await createTestProvider(['aspen-gulch', 'saguaro-flats'])
    const saguaroShift = await manager.post('/api/shifts', shiftBody(provider.providerId, { siteId: saguaro, rrule: 'FREQ=MONTHLY;BYDAY=1MO', validFrom: '2026-01-01', validUntil: '2026-02-28', localStart: '09:00', localEnd: '13:00' }))
    expect(saguaroShift.status).toBe(201)
    // Aspen Gulch 10:00–11:00 every other Monday from 5 Jan: 5 Jan (MST = Phoenix time) is 10:00–11:00 in Phoenix, inside 09:00–13:00.
    const response = await manager.post('/api/shifts', shiftBody(provider.providerId, { rrule: 'FREQ=WEEKLY;INTERVAL=2;BYDAY=MO', validFrom: '2026-01-05', localStart: '10:00', localEnd: '11:00' }))
    expect(response.status).toBe(409)
    expect(response.body.data.date).toBe('2026-01-05')
  })

  it('accepts a shift that only touches another site\'s shift (half-open intervals)', async () => {
    const dentist = twin
    // Dates far from today (the browser tests draw this week's rota from the same database), computed
    // so the test holds on any date: the winter before daylight saving time starts in the year after
    // next. U.S. DST starts on the second Sunday in March (15 U.S.C. §260a, Energy Policy Act 2005).
    const year = DateTime.utc().year + 2
    const marchFirst = DateTime.fromObject({ year, month: 3, day: 1 }, { zone: 'UTC' })
    const dstSunday = marchFirst.plus({ days: ((7 - marchFirst.weekday) % 7) + 7 })
    const lastWinterWednesday = dstSunday.minus({ days: 4 })
    // Saguaro Flats Wednesdays 07:00–15:00 Phoenix (UTC−07:00 all year). In winter Aspen Gulch is
    // MST, also UTC−07:00 (IANA tz database), so Aspen 15:00–18:00 starts exactly when Saguaro ends.
    const touching = shiftBody(dentist, {
      rrule: 'FREQ=WEEKLY;BYDAY=WE', validFrom: lastWinterWednesday.minus({ weeks: 17 }).toISODate(), validUntil: lastWinterWednesday.toISODate(), localStart: '15:00', localEnd: '18:00',
    })
    const response = await manager.post('/api/shifts', touching)
    expect(response.status, JSON.stringify(response.body)).toBe(201)
    await manager.delete(`/api/shifts/${response.body.id}`)
    // From the DST Sunday Denver is on MDT (UTC−06:00): 15:00 there is 14:00 in Phoenix, an overlap on the Wednesday after.
    const intoSummer = await manager.post('/api/shifts', { ...touching, validUntil: dstSunday.plus({ days: 19 }).toISODate() })
    expect(intoSummer.status).toBe(409)
    expect(intoSummer.body.data.date).toBe(dstSunday.plus({ days: 3 }).toISODate())
  })
})

describe('availability', () => {
  it('returns the demo dentist at Quarry Street on a winter Monday in UTC and local time', async () => {
    const dentist = await providerIdByEmail('dentist@fernhollow.test')
    const response = await deskQuarry.get(`/api/availability?siteId=${quarry}&from=2026-02-02&to=2026-02-02`)
    expect(response.status).toBe(200)
    expect(response.body.timeZone).toBe('America/Los_Angeles')
    // IANA tz database: America/Los_Angeles is PST, UTC−08:00, on 2 February 2026.
    expect(response.body.fromUtc).toBe('2026-02-02T08:00:00.000Z')
    const mine = response.body.providers.find((p: { providerId: number }) => p.providerId === dentist)
    // 07:30–16:30 with the site's lunch block 12:00–12:45 taken out.
    expect(mine.intervals).toEqual([
      { startUtc: '2026-02-02T15:30:00.000Z', endUtc: '2026-02-02T20:00:00.000Z', startLocalIso: '2026-02-02T07:30:00-08:00', endLocalIso: '2026-02-02T12:00:00-08:00' },
      { startUtc: '2026-02-02T20:45:00.000Z', endUtc: '2026-02-03T00:30:00.000Z', startLocalIso: '2026-02-02T12:45:00-08:00', endLocalIso: '2026-02-02T16:30:00-08:00' },
    ])
    expect(response.body.blocks).toContainEqual(expect.objectContaining({ reason: 'Lunch', startLocalIso: '2026-02-02T12:00:00-08:00', endUtc: '2026-02-02T20:45:00.000Z' }))
    expect(response.body.operatories).toHaveLength(5)
  })

  it('moves the same wall time an hour earlier in UTC in summer (PDT, UTC−07:00, IANA tz database)', async () => {
    const dentist = await providerIdByEmail('dentist@fernhollow.test')
    const response = await deskQuarry.get(`/api/availability?siteId=${quarry}&from=2026-06-01&to=2026-06-01`)
    const mine = response.body.providers.find((p: { providerId: number }) => p.providerId === dentist)
    expect(mine.intervals[0]).toEqual({ startUtc: '2026-06-01T14:30:00.000Z', endUtc: '2026-06-01T19:00:00.000Z', startLocalIso: '2026-06-01T07:30:00-07:00', endLocalIso: '2026-06-01T12:00:00-07:00' })
  })

  it.each([
    ['from=monday', 'from'],
    ['from=2026-02-02&to=2026-01-01', 'to'],
    ['from=2026-01-01&to=2026-12-31', 'to'],
    ['from=2026-02-02T08:00:00&to=2026-02-03', 'from'],
    ['from=2026-02-02T00:00:00-08:00&to=2026-02-03', 'from'],
    ['from=2026-02-02&to=2026-02-03T08:00:00.000Z', 'to'],
    ['from=2026-02-30', 'from'],
  ])('answers %s with a 400 naming %s', async (query, field) => {
    const response = await deskQuarry.get(`/api/availability?siteId=${quarry}&${query}${query.includes('to=') ? '' : '&to=2026-02-03'}`)
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe(field)
  })

  it('takes time off out of the provider\'s availability', async () => {
    const provider = await createTestProvider(['aspen-gulch'])
    await manager.post('/api/shifts', shiftBody(provider.providerId, { rrule: 'FREQ=WEEKLY;BYDAY=MO,TU', validFrom: '2026-04-06', validUntil: '2026-04-30' }))
    const off = await manager.post('/api/shift-exceptions', { providerId: provider.providerId, kind: 'time_off', startDate: '2026-04-07', endDate: '2026-04-07', reason: 'Course' })
    expect(off.status).toBe(201)
    const response = await manager.get(`/api/availability?siteId=${aspen}&from=2026-04-06&to=2026-04-07`)
    const mine = response.body.providers.find((p: { providerId: number }) => p.providerId === provider.providerId)
    expect(new Set(mine.intervals.map((i: { startLocalIso: string }) => i.startLocalIso.slice(0, 10)))).toEqual(new Set(['2026-04-06']))
  })
})

describe('exceptions and blocks', () => {
  it('needs a site for an extra shift and both times or neither', async () => {
    const providerId = await providerIdByEmail('hygienist@fernhollow.test')
    const noSite = await manager.post('/api/shift-exceptions', { providerId, kind: 'extra', startDate: '2026-05-02', endDate: '2026-05-02' })
    expect(noSite.status).toBe(400)
    expect(noSite.body.data.field).toBe('siteId')
    const oneTime = await manager.post('/api/shift-exceptions', { providerId, kind: 'extra', siteId: aspen, startDate: '2026-05-02', endDate: '2026-05-02', localStart: '09:00' })
    expect(oneTime.body.data.field).toBe('localEnd')
  })

  it('adds an extra Saturday that shows on the rota grid', async () => {
    const providerId = await providerIdByEmail('hygienist@fernhollow.test')
    const extra = await manager.post('/api/shift-exceptions', { providerId, kind: 'extra', siteId: aspen, startDate: '2026-05-02', endDate: '2026-05-02', localStart: '09:00', localEnd: '13:00' })
    expect(extra.status).toBe(201)
    const rota = await manager.get(`/api/rota?siteId=${aspen}&from=2026-04-27&to=2026-05-03`)
    expect(rota.status).toBe(200)
    expect(rota.body.entries).toContainEqual(expect.objectContaining({ kind: 'extra', date: '2026-05-02', localStart: '09:00', startUtc: '2026-05-02T15:00:00.000Z' }))
    expect((await manager.delete(`/api/shift-exceptions/${extra.body.id}`)).status).toBe(200)
  })

  it('creates a recurring block for one room, with a reason, and refuses a room of another site', async () => {
    const [room] = (await manager.get(`/api/operatories?siteId=${aspen}`)).body
    const [quarryRoom] = (await manager.get(`/api/operatories?siteId=${quarry}`)).body
    const body = { siteId: aspen, operatoryId: room.id, startDate: '2026-04-01', localStart: '08:00', localEnd: '09:00', rrule: 'FREQ=MONTHLY;BYDAY=1WE', reason: 'Sterilizer check' }
    const created = await manager.post('/api/blocks', body)
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ operatoryId: room.id, providerId: null, ruleText: 'the first Wednesday of each month' })
    const availability = await manager.get(`/api/availability?siteId=${aspen}&from=2026-04-01&to=2026-04-01`)
    const chair = availability.body.operatories.find((o: { operatoryId: number }) => o.operatoryId === room.id)
    // Aspen Gulch opens 08:00; the block holds this chair until 09:00 (MDT, UTC−06:00).
    expect(chair.intervals[0].startLocalIso).toBe('2026-04-01T09:00:00-06:00')

    const noReason = await manager.post('/api/blocks', { ...body, reason: ' ' })
    expect(noReason.body.data).toMatchObject({ field: 'reason', reason: 'is required' })
    const foreignRoom = await manager.post('/api/blocks', { ...body, operatoryId: quarryRoom.id })
    expect(foreignRoom.status).toBe(400)
    expect(foreignRoom.body.data.field).toBe('operatoryId')
    expect((await deskQuarry.post('/api/blocks', { ...body, siteId: quarry, operatoryId: null })).status).toBe(403)
    expect((await manager.delete(`/api/blocks/${created.body.id}`)).status).toBe(200)
  })
})
