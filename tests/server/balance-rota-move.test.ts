// Balance's rota move in one step (issue 17 §3), against the real server and MariaDB: a provider's day
// moved from a quiet annex in Los Angeles to a tight one in Denver. The preview (dryRun) lists what the
// whole move strands and writes nothing; the save writes the day off and the extra day in one
// transaction, the extra day on Denver's clock: the same instants, clamped to Denver's opening hours
// (our own rule, common practice, no source; zone offsets from the IANA tz data). Bad input is a 400
// naming the field; a move that cannot be made is a 409 in plain words, and writes nothing.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt, type Annex } from '../helpers/booking-fixtures'
import { daysFromToday, plusDays, weekdayAhead, TUESDAY } from '../helpers/dates'

const LA = 'America/Los_Angeles'
const DENVER = 'America/Denver'
let manager: ApiClient
let quiet: Annex
let tight: Annex
let third: Annex
let day: string

const exceptionsOf = async (providerId: number, date: string) => (await testDb()('shift_exceptions').where({ provider_id: providerId, start_date: date })
  .select('kind', 'site_id', 'local_start', 'local_end')).map((row) => `${row.kind}@${row.site_id} ${row.local_start ?? ''}-${row.local_end ?? ''}`).sort()

beforeAll(async () => {
  manager = await signedInAs('manager@fernhollow.test')
  quiet = await createAnnex({ rooms: 1, providers: 1, patients: 2, timeZone: LA })
  tight = await createAnnex({ rooms: 1, providers: 1, patients: 1, timeZone: DENVER })
  third = await createAnnex({ rooms: 1, providers: 0, patients: 0, timeZone: 'America/Chicago' })
  day = weekdayAhead(14, TUESDAY, LA)
  const db = testDb()
  // The quiet annex's dentist works 08:00–16:00 Los Angeles time; Denver opens 08:00–12:00 and 13:00–16:30.
  await db('shifts').where({ provider_id: quiet.providerIds[0] }).update({ local_start: '08:00', local_end: '16:00' })
  const hours = [{ start: '08:00', end: '12:00' }, { start: '13:00', end: '16:30' }]
  await db('sites').where({ id: tight.siteId }).update({ opening_hours: JSON.stringify({ 1: hours, 2: hours, 3: hours, 4: hours, 5: hours, 6: hours, 7: hours }) })
  const dentist = await db('providers').where({ id: quiet.providerIds[0] }).first('user_id')
  await db('user_sites').insert([{ user_id: dentist.user_id, site_id: tight.siteId }, { user_id: dentist.user_id, site_id: third.siteId }])
  // Denver's chair holds one visit that day (tight); Los Angeles holds none (quiet).
  const booked = await manager.post('/api/visits', { siteId: tight.siteId, operatoryId: tight.operatoryIds[0], providerId: tight.providerIds[0], patientId: tight.patientIds[0], startUtc: utcAt(`${day}T09:00`, DENVER), items: FILLING })
  expect(booked.status, JSON.stringify(booked.body)).toBe(201)
})
afterAll(closeTestDb)

describe('moving a rota day from a quiet site to a tight one in another time zone', () => {
  it('suggests it with the hours on each site\'s own clock', async () => {
    const response = await manager.get(`/api/balance/suggestions?from=${day}&to=${day}&quietBelow=0.02&tightFrom=0.03`)
    expect(response.status).toBe(200)
    const move = response.body.suggestions.find((item: { kind: string; fromSiteId?: number; toSiteId?: number }) => item.kind === 'rota_move' && item.fromSiteId === quiet.siteId && item.toSiteId === tight.siteId)
    // 08:00–16:00 in Los Angeles is 09:00–17:00 in Denver, which closes at 16:30.
    expect(move).toMatchObject({ providerId: quiet.providerIds[0], date: day, localStart: '08:00', localEnd: '16:00', toLocalStart: '09:00', toLocalEnd: '16:30' })
  })

  it('previews the whole move with the visit it strands, and writes nothing', async () => {
    const patientVisit = await manager.post('/api/visits', { siteId: quiet.siteId, operatoryId: quiet.operatoryIds[0], providerId: quiet.providerIds[0], patientId: quiet.patientIds[0], startUtc: utcAt(`${day}T10:00`, LA), items: FILLING })
    expect(patientVisit.status).toBe(201)
    const body = { providerId: quiet.providerIds[0], date: day, fromSiteId: quiet.siteId, toSiteId: tight.siteId }
    const preview = await manager.post('/api/balance/rota-moves', { ...body, dryRun: true })
    expect(preview.status, JSON.stringify(preview.body)).toBe(200)
    expect(preview.body).toMatchObject({
      dryRun: true,
      move: { fromLocalStart: '08:00', fromLocalEnd: '16:00', toLocalStart: '09:00', toLocalEnd: '16:30', startUtc: new Date(utcAt(`${day}T08:00`, LA)).toISOString(), endUtc: new Date(utcAt(`${day}T16:30`, DENVER)).toISOString() },
    })
    expect(preview.body.strandedVisits.map((visit: { id: number }) => visit.id)).toEqual([patientVisit.body.id])
    expect(await exceptionsOf(quiet.providerIds[0]!, day)).toEqual([])
    expect((await testDb()('visits').where({ id: patientVisit.body.id }).first('stranded_reason')).stranded_reason).toBeNull()

    // Confirmed: both rota changes, the extra day on Denver's clock; the visit needs a new time.
    const saved = await manager.post('/api/balance/rota-moves', body)
    expect(saved.status, JSON.stringify(saved.body)).toBe(201)
    expect(saved.body.strandedVisits.map((visit: { id: number }) => visit.id)).toEqual([patientVisit.body.id])
    expect(await exceptionsOf(quiet.providerIds[0]!, day)).toEqual([`extra@${tight.siteId} 09:00-16:30`, `time_off@${quiet.siteId} -`])
    expect((await testDb()('visits').where({ id: patientVisit.body.id }).first('stranded_reason')).stranded_reason).not.toBeNull()
    // The provider is on shift in Denver 09:00–16:30 there, the instants they were to work in Los Angeles.
    const rota = await manager.get(`/api/availability?siteId=${tight.siteId}&from=${day}&to=${day}`)
    expect(rota.status, JSON.stringify(rota.body)).toBe(200)
    const time = rota.body.providers.find((entry: { providerId: number }) => entry.providerId === quiet.providerIds[0])
    expect(time.intervals.map((interval: { startUtc: string; endUtc: string }) => [DateTime.fromISO(interval.startUtc).setZone(DENVER).toFormat('HH:mm'), DateTime.fromISO(interval.endUtc).setZone(DENVER).toFormat('HH:mm')])).toEqual([['09:00', '16:30']])

    // Moved once: there is no day left to move (409 in words), and nothing more is written.
    const again = await manager.post('/api/balance/rota-moves', body)
    expect(again.status).toBe(409)
    expect(again.body.message).toContain('is not on shift at')
    expect(await exceptionsOf(quiet.providerIds[0]!, day)).toHaveLength(2)
  })

  it('writes neither change when the extra day clashes with another site (one transaction)', async () => {
    const date = plusDays(day, 1)
    // A one-day shift at a third site, 11:00–12:00 Chicago time (10:00–11:00 in Denver).
    await testDb()('shifts').insert({ provider_id: quiet.providerIds[0], site_id: third.siteId, rrule: 'FREQ=DAILY', valid_from: date, valid_until: date, local_start: '11:00', local_end: '12:00' })
    const refused = await manager.post('/api/balance/rota-moves', { providerId: quiet.providerIds[0], date, fromSiteId: quiet.siteId, toSiteId: tight.siteId })
    expect(refused.status).toBe(409)
    expect(refused.body.message).toContain('already works at')
    expect(await exceptionsOf(quiet.providerIds[0]!, date)).toEqual([])
  })

  it('refuses a closed receiving site and a provider already on shift there, in plain words', async () => {
    const closedDate = plusDays(day, 2)
    await testDb()('sites').where({ id: tight.siteId }).update({ closed_dates: JSON.stringify([closedDate]) })
    const closed = await manager.post('/api/balance/rota-moves', { providerId: quiet.providerIds[0], date: closedDate, fromSiteId: quiet.siteId, toSiteId: tight.siteId, dryRun: true })
    expect(closed.status).toBe(409)
    expect(closed.body.message).toMatch(/is closed on .*, or not open during/)
    // An early hour in Denver that day (07:00–08:00 in Los Angeles, before the shift there): already on shift at the tight site.
    const date = plusDays(day, 3)
    const body = { providerId: quiet.providerIds[0], date, fromSiteId: quiet.siteId, toSiteId: tight.siteId, dryRun: true }
    expect((await manager.post('/api/balance/rota-moves', body)).status).toBe(200)
    await testDb()('shifts').insert({ provider_id: quiet.providerIds[0], site_id: tight.siteId, rrule: 'FREQ=DAILY', valid_from: date, valid_until: date, local_start: '08:00', local_end: '09:00' })
    const onShift = await manager.post('/api/balance/rota-moves', body)
    expect(onShift.status).toBe(409)
    expect(onShift.body.message).toContain('is already on shift at')
    expect(await exceptionsOf(quiet.providerIds[0]!, date)).toEqual([])
  })

  it('answers 400 naming the field, 401 signed out, 403 for the front desk', async () => {
    const base = { providerId: quiet.providerIds[0], date: day, fromSiteId: quiet.siteId, toSiteId: tight.siteId, dryRun: true }
    for (const [body, field] of [
      [{ ...base, toSiteId: quiet.siteId }, 'toSiteId'],
      [{ ...base, date: 'next Tuesday' }, 'date'],
      [{ ...base, date: daysFromToday(-2, LA) }, 'date'],
      [{ ...base, providerId: undefined }, 'providerId'],
      [{ ...base, fromSiteId: 99_999_999 }, 'fromSiteId'],
      [{ ...base, dryRun: 'yes' }, 'dryRun'],
    ] as const) {
      const response = await manager.post('/api/balance/rota-moves', body)
      expect(response.status, JSON.stringify(response.body)).toBe(400)
      expect(response.body.data.field).toBe(field)
    }
    expect((await new ApiClient().post('/api/balance/rota-moves', base)).status).toBe(401)
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    expect((await desk.post('/api/balance/rota-moves', base)).status).toBe(403)
  })
})
