// Booking never double-books: concurrency, numbing interleave, moves, states, idempotency.
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { startAppServer, type RunningServer } from '../helpers/app-server'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { atAhead, weekdayAhead, MONDAY, TUESDAY, WEDNESDAY, THURSDAY, FRIDAY } from '../helpers/dates'
import type { DisplayStyle } from '../../shared/types/display'
import { formatDateTime, formatTime } from '../../shared/utils/display-time'

const QUARRY_ZONE = 'America/Los_Angeles'
let manager: ApiClient
let quarry: { siteId: number; chair1: number; chair2: number; chair3: number; hygieneA: number; hygieneB: number; dentist: number; patients: number[] }

beforeAll(async () => {
  manager = await signedInAs('manager@fernhollow.test')
  const siteId = await siteIdBySlug('quarry-street')
  const rooms = await testDb()('operatories').where({ site_id: siteId }).orderBy('sort_order').pluck('id')
  const dentist = await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('users.email', 'dentist@fernhollow.test').first('providers.id')
  const patients = await testDb()('patients').orderBy('id').limit(40).pluck('id')
  quarry = { siteId, chair1: rooms[0], chair2: rooms[1], chair3: rooms[2], hygieneA: rooms[3], hygieneB: rooms[4], dentist: dentist.id, patients }
})
afterAll(closeTestDb)

function booking(overrides: Record<string, unknown>) {
  return { siteId: quarry.siteId, operatoryId: quarry.chair1, providerId: quarry.dentist, patientId: quarry.patients[0], items: FILLING, ...overrides }
}

async function visitsAt(operatoryId: number, startUtc: string): Promise<number> {
  const row = await testDb()('visits').where({ operatory_id: operatoryId, start_utc: new Date(startUtc) }).whereNot('state', 'cancelled').count({ count: '*' }).first()
  return Number(row!.count)
}

function statuses(responses: Array<{ status: number }>): Record<number, number> {
  return responses.reduce<Record<number, number>>((counts, response) => ({ ...counts, [response.status]: (counts[response.status] ?? 0) + 1 }), {})
}

describe('booking a visit', () => {
  it('books a two-surface filling with its segments, an audit row and an outbox row', async () => {
    const startUtc = atAhead(2, MONDAY, '09:00', QUARRY_ZONE) // a Monday: the demo dentist is at Quarry Street
    const consenting = await testDb()('patients').whereNotNull('email').where({ email_consent: true }).first('id')
    const response = await manager.post('/api/visits', booking({ startUtc, patientId: consenting.id, operatoryId: quarry.chair3 }))
    expect(response.status).toBe(201)
    expect(response.body).toMatchObject({ state: 'booked', rowVersion: 1, startUtc: new Date(startUtc).toISOString() })
    const kinds = response.body.segments.map((segment: { kind: string }) => segment.kind)
    expect(kinds).toContain('numbing')
    expect(response.body.segments[0].startUtc).toBe(response.body.startUtc)
    expect(response.body.segments.at(-1).endUtc).toBe(response.body.endUtc)
    expect(await testDb()('audit_log').where({ action: 'visit_booked', entity_id: String(response.body.id) })).toHaveLength(1)
    expect(await testDb()('outbox').where({ visit_id: response.body.id, kind: 'invitation' })).toHaveLength(1)
  })

  it('books a second patient in another chair during the first one\'s numbing wait, not during hands-on work', async () => {
    const first = await manager.post('/api/visits', booking({ startUtc: atAhead(3, MONDAY, '09:00', QUARRY_ZONE), patientId: quarry.patients[1] }))
    expect(first.status).toBe(201)
    const numbing = first.body.segments.find((segment: { kind: string }) => segment.kind === 'numbing')
    expect(numbing).toBeTruthy()
    // A sealant's hands-on minutes fit inside the 10-minute onset wait of the first patient's block.
    const sealant = [{ templateCode: 'SEAL', tooth: '3' }]
    const during = await manager.post('/api/visits', booking({ startUtc: atAhead(3, MONDAY, '09:05', QUARRY_ZONE), operatoryId: quarry.hygieneA, patientId: quarry.patients[2], items: sealant }))
    expect(during.status, JSON.stringify(during.body)).toBe(201)
    const overlapping = await manager.post('/api/visits', booking({ startUtc: atAhead(3, MONDAY, '09:10', QUARRY_ZONE), operatoryId: quarry.hygieneB, patientId: quarry.patients[3], items: sealant }))
    expect(overlapping.status).toBe(409)
    expect(overlapping.body.data.conflict).toMatchObject({ resource: 'provider', id: quarry.dentist })
    expect(overlapping.body.message).toMatch(/already working with another patient/)
  })

  it('refuses a second visit for a patient who already has one then', async () => {
    const startUtc = atAhead(4, MONDAY, '10:00', QUARRY_ZONE)
    expect((await manager.post('/api/visits', booking({ startUtc, patientId: quarry.patients[4] }))).status).toBe(201)
    // Another room and another provider: only the patient is double-booked.
    const hygienist = await providerIdOf('hygienist.two@fernhollow.test')
    const again = await manager.post('/api/visits', booking({ startUtc, patientId: quarry.patients[4], operatoryId: quarry.hygieneA, providerId: hygienist, items: [{ templateCode: 'SEAL', tooth: '3' }] }))
    expect(again.status).toBe(409)
    expect(again.body.data.conflict).toMatchObject({ resource: 'patient', id: quarry.patients[4] })
    // The refused visit's insert went to MariaDB with the clash check (one round trip) and was rolled back.
    const patientVisits = await testDb()('visits').where({ patient_id: quarry.patients[4], start_utc: new Date(startUtc) }).count({ count: '*' }).first()
    expect(Number(patientVisits!.count)).toBe(1)
  })

  it.each([
    ['startUtc', { startUtc: atAhead(2, MONDAY, '09:03', QUARRY_ZONE) }, /grid/],
    ['startUtc', { startUtc: '2020-01-06T17:00:00Z' }, /from now/],
    ['startUtc', { startUtc: 'next monday' }, /ISO date-time/],
    ['operatoryId', { startUtc: atAhead(6, MONDAY, '09:00', QUARRY_ZONE), operatoryId: 999999 }, /not a room/],
    ['patientId', { startUtc: atAhead(6, MONDAY, '09:00', QUARRY_ZONE), patientId: 99999999 }, /no such patient/],
    ['items.0.surfaces', { startUtc: atAhead(6, MONDAY, '09:00', QUARRY_ZONE), items: [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MOX' }] }, /X/],
  ])('answers 400 naming %s', async (field, change, reason) => {
    const response = await manager.post('/api/visits', booking(change))
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe(field)
    expect(response.body.data.reason).toMatch(reason)
  })

  it('refuses a chair without the equipment (a filling in a hygiene room)', async () => {
    const response = await manager.post('/api/visits', booking({ startUtc: atAhead(6, MONDAY, '09:00', QUARRY_ZONE), operatoryId: quarry.hygieneA }))
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe('operatoryId')
  })

  it('answers 409 outside opening hours and when the provider is not on shift', async () => {
    const lateEvening = await manager.post('/api/visits', booking({ startUtc: atAhead(6, MONDAY, '19:00', QUARRY_ZONE) }))
    expect(lateEvening.status).toBe(409)
    expect(lateEvening.body.data.conflict.resource).toBe('operatory')
    // Wednesdays the demo dentist works at Saguaro Flats, not Quarry Street.
    const wednesday = await manager.post('/api/visits', booking({ startUtc: atAhead(6, WEDNESDAY, '09:00', QUARRY_ZONE) }))
    expect(wednesday.status).toBe(409)
    expect(wednesday.body.data.conflict.resource).toBe('provider')
  })

  it('keeps front desk to its own sites and signed-out callers out', async () => {
    const desk = await signedInAs('desk.aspen@fernhollow.test')
    expect((await desk.post('/api/visits', booking({ startUtc: atAhead(6, MONDAY, '09:00', QUARRY_ZONE) }))).status).toBe(403)
    const hygienist = await signedInAs('hygienist@fernhollow.test')
    expect((await hygienist.post('/api/visits', booking({ startUtc: atAhead(6, MONDAY, '09:00', QUARRY_ZONE) }))).status).toBe(403)
    expect((await new ApiClient().post('/api/visits', booking({}))).status).toBe(401)
  })
})

describe('moving, states and cancelling', () => {
  it('moves with the current row version, refuses a stale one and a busy chair', async () => {
    const a = await manager.post('/api/visits', booking({ startUtc: atAhead(5, MONDAY, '13:00', QUARRY_ZONE), patientId: quarry.patients[5] }))
    const b = await manager.post('/api/visits', booking({ startUtc: atAhead(5, MONDAY, '13:00', QUARRY_ZONE), patientId: quarry.patients[6], operatoryId: quarry.chair2, providerId: quarry.dentist, items: [{ templateCode: 'EXAM-EMER' }] }))
    expect(a.status).toBe(201)
    expect([201, 409]).toContain(b.status)
    const moved = await manager.patch(`/api/visits/${a.body.id}`, { rowVersion: 1, startUtc: atAhead(5, MONDAY, '14:30', QUARRY_ZONE) })
    expect(moved.status).toBe(200)
    expect(moved.body).toMatchObject({ rowVersion: 2, icalSequence: 1, startUtc: new Date(atAhead(5, MONDAY, '14:30', QUARRY_ZONE)).toISOString() })
    const stale = await manager.patch(`/api/visits/${a.body.id}`, { rowVersion: 1, startUtc: atAhead(5, MONDAY, '15:00', QUARRY_ZONE) })
    expect(stale.status).toBe(409)
    expect(stale.body.data.field).toBe('rowVersion')

    const blocker = await manager.post('/api/visits', booking({ startUtc: atAhead(5, MONDAY, '14:30', QUARRY_ZONE), patientId: quarry.patients[7], operatoryId: quarry.chair3, providerId: await otherQuarryDentist(), items: [{ templateCode: 'EXAM-EMER' }] }))
    expect(blocker.status).toBe(201)
    const ontoBusy = await manager.patch(`/api/visits/${a.body.id}`, { rowVersion: 2, operatoryId: quarry.chair3 })
    expect(ontoBusy.status).toBe(409)
    expect(ontoBusy.body.data.conflict).toMatchObject({ resource: 'operatory', id: quarry.chair3, visitId: blocker.body.id })
    const unchanged = await manager.get(`/api/visits/${a.body.id}`)
    expect(unchanged.body).toMatchObject({ operatoryId: quarry.chair1, rowVersion: 2 })
  })

  it('changes a visit\'s length by hand only with a reason, and never below the work itself', async () => {
    const visit = await manager.post('/api/visits', booking({ startUtc: atAhead(6, THURSDAY, '08:00', QUARRY_ZONE), patientId: quarry.patients[11] }))
    expect(visit.status).toBe(201)
    const minutes = (Date.parse(visit.body.endUtc) - Date.parse(visit.body.startUtc)) / 60_000
    const noReason = await manager.patch(`/api/visits/${visit.body.id}`, { rowVersion: 1, lengthOverride: { chairMinutes: minutes + 15, reason: '' } })
    expect(noReason.status).toBe(400)
    expect(noReason.body.data.field).toBe('lengthOverride.reason')
    const tooShort = await manager.patch(`/api/visits/${visit.body.id}`, { rowVersion: 1, lengthOverride: { chairMinutes: 10, reason: 'in a hurry' } })
    expect(tooShort.status).toBe(400)
    expect(tooShort.body.data.field).toBe('lengthOverride.chairMinutes')
    const longer = await manager.patch(`/api/visits/${visit.body.id}`, { rowVersion: 1, lengthOverride: { chairMinutes: minutes + 15, reason: 'anxious patient' } })
    expect(longer.status).toBe(200)
    expect((Date.parse(longer.body.endUtc) - Date.parse(longer.body.startUtc)) / 60_000).toBe(minutes + 15)
    expect(longer.body.plan.lengthOverride).toEqual({ chairMinutes: minutes + 15, reason: 'anxious patient' })
    expect(longer.body.segments.at(-1).endUtc).toBe(longer.body.endUtc)
  })

  it('allows only the glossary\'s state transitions and frees the time on cancel', async () => {
    const startUtc = atAhead(5, THURSDAY, '10:00', QUARRY_ZONE) // a Thursday
    const visit = await manager.post('/api/visits', booking({ startUtc, patientId: quarry.patients[8] }))
    expect(visit.status).toBe(201)
    const id = visit.body.id
    expect((await manager.post(`/api/visits/${id}/state`, { state: 'finished' })).status).toBe(409)
    expect((await manager.post(`/api/visits/${id}/state`, { state: 'confirmed', rowVersion: 99 })).status).toBe(409)
    expect((await manager.post(`/api/visits/${id}/state`, { state: 'confirmed', rowVersion: 1 })).body.state).toBe('confirmed')
    expect((await manager.post(`/api/visits/${id}/state`, { state: 'booked' })).body.state).toBe('booked')
    expect((await manager.post(`/api/visits/${id}/state`, { state: 'treating' })).status).toBe(409)
    // Arrived, in treatment and did not come follow the visit's day: tests/server/visit-state-rules.test.ts.
    expect((await manager.post(`/api/visits/${id}/state`, { state: 'arrived' })).status).toBe(409)
    expect((await manager.post(`/api/visits/${id}/state`, { state: 'asleep' })).status).toBe(400)

    const other = await manager.post('/api/visits', booking({ startUtc: atAhead(5, THURSDAY, '13:00', QUARRY_ZONE), patientId: quarry.patients[9] }))
    expect((await manager.post(`/api/visits/${other.body.id}/cancel`, {})).status).toBe(400)
    const cancelled = await manager.post(`/api/visits/${other.body.id}/cancel`, { reason: 'Patient is travelling' })
    expect(cancelled.body).toMatchObject({ state: 'cancelled', cancelReason: 'Patient is travelling', segments: [] })
    expect((await manager.post('/api/visits', booking({ startUtc: atAhead(5, THURSDAY, '13:00', QUARRY_ZONE), patientId: quarry.patients[10] }))).status).toBe(201)
  })
})

async function providerIdOf(email: string): Promise<number> {
  const row = await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('users.email', email).first('providers.id')
  return row.id
}

function otherQuarryDentist(): Promise<number> {
  return providerIdOf('dentist.three@fernhollow.test')
}

describe('concurrency (real MariaDB, real HTTP)', () => {
  let annex: Annex
  let second: RunningServer
  beforeAll(async () => {
    annex = await createAnnex({ rooms: 50, providers: 3, patients: 150 })
    second = await startAppServer()
  })
  afterAll(async () => { await second?.stop() })

  function annexBooking(index: number, overrides: Record<string, unknown>) {
    return { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[index], items: FILLING, ...overrides }
  }

  it('50 simultaneous bookings of one chair at one time: exactly one wins', async () => {
    const startUtc = atAhead(2, MONDAY, '09:00', annex.timeZone)
    const clients = await Promise.all(Array.from({ length: 5 }, () => signedInAs('admin@fernhollow.test')))
    const responses = await Promise.all(Array.from({ length: 50 }, (_, index) =>
      clients[index % 5]!.post('/api/visits', annexBooking(index, { startUtc, providerId: annex.providerIds[index % 3] }))))
    expect(statuses(responses)).toEqual({ 201: 1, 409: 49 })
    expect(await visitsAt(annex.operatoryIds[0]!, startUtc)).toBe(1)
  })

  it('50 simultaneous bookings in 50 chairs that all need one provider hands-on: exactly one wins', async () => {
    const startUtc = atAhead(2, TUESDAY, '09:00', annex.timeZone)
    const responses = await Promise.all(Array.from({ length: 50 }, (_, index) =>
      manager.post('/api/visits', annexBooking(50 + index, { startUtc, operatoryId: annex.operatoryIds[index] }))))
    expect(statuses(responses)).toEqual({ 201: 1, 409: 49 })
    const booked = await testDb()('visits').where({ provider_id: annex.providerIds[0], start_utc: new Date(startUtc) }).count({ count: '*' }).first()
    expect(Number(booked!.count)).toBe(1)
  })

  it('the same race across two app server processes sharing the database', async () => {
    const startUtc = atAhead(2, WEDNESDAY, '09:00', annex.timeZone)
    const onSecond = new ApiClient(second.url)
    await onSecond.signIn('manager@fernhollow.test')
    const responses = await Promise.all(Array.from({ length: 50 }, (_, index) =>
      (index % 2 ? onSecond : manager).post('/api/visits', annexBooking(100 + index, { startUtc, operatoryId: annex.operatoryIds[1] }))))
    expect(statuses(responses)).toEqual({ 201: 1, 409: 49 })
    expect(await visitsAt(annex.operatoryIds[1]!, startUtc)).toBe(1)
  })

  it('an Idempotency-Key repeated (even at once) books one visit and answers the same', async () => {
    const startUtc = atAhead(2, THURSDAY, '09:00', annex.timeZone)
    const body = annexBooking(0, { startUtc, operatoryId: annex.operatoryIds[2] })
    const headers = { 'idempotency-key': `test-key-${annex.siteId}` }
    const [first, second] = await Promise.all([manager.post('/api/visits', body, { headers }), manager.post('/api/visits', body, { headers })])
    expect(first.status).toBe(201)
    expect(second.status).toBe(201)
    expect(second.body.id).toBe(first.body.id)
    const third = await manager.post('/api/visits', body, { headers })
    expect(third.body.id).toBe(first.body.id)
    expect(await visitsAt(annex.operatoryIds[2]!, startUtc)).toBe(1)
    const reused = await manager.post('/api/visits', { ...body, operatoryId: annex.operatoryIds[3] }, { headers })
    expect(reused.status).toBe(409)
  })

  describe('a chair locked by someone else for too long', () => {
    let impatient: RunningServer
    let onImpatient: ApiClient
    beforeAll(async () => {
      // This server waits one second for a row lock (MariaDB error 1205 after that), then retries.
      impatient = await startAppServer({ NUXT_DB_LOCK_WAIT_SECONDS: '1' })
      onImpatient = new ApiClient(impatient.url)
      await onImpatient.signIn('manager@fernhollow.test')
    })
    afterAll(async () => { await impatient?.stop() })

    /** Holds the chair's row lock the way a booking does, until the returned release is called. */
    async function holdChair(operatoryId: number) {
      const trx = await testDb().transaction()
      await trx('operatories').where({ id: operatoryId }).increment('booking_seq', 1)
      return () => trx.rollback()
    }

    /**
     * Resolves once the booking's lock statement on the chair has waited, given up and started waiting
     * again: the request is in a retry. Read from the processlist (the app connects as the same user).
     */
    async function waitForLockRetry(operatoryId: number) {
      let waits = 0
      let lastMs = -1
      await vi.waitFor(async () => {
        const [rows] = await testDb().raw(
          "SELECT TIME_MS AS ms FROM information_schema.PROCESSLIST WHERE ID <> CONNECTION_ID() AND COMMAND = 'Query' AND INFO LIKE ?",
          [`update \`operatories\` set \`booking_seq\` = \`booking_seq\` + 1 where \`id\` = ${operatoryId}`])
        const ms = rows[0] === undefined ? undefined : Number(rows[0].ms)
        if (ms === undefined) lastMs = -1
        else {
          if (lastMs < 0 || ms < lastMs) waits += 1
          lastMs = ms
        }
        if (waits < 2) throw new Error(`the booking has waited for the chair ${waits} time(s), not yet retried`)
      }, { timeout: 15_000, interval: 50 })
    }

    it('is retried, and answers 503 in words after the third lock wait timeout, booking nothing', async () => {
      const startUtc = atAhead(2, FRIDAY, '09:00', annex.timeZone)
      const release = await holdChair(annex.operatoryIds[4]!)
      try {
        const started = Date.now()
        const response = await onImpatient.post('/api/visits', annexBooking(1, { startUtc, operatoryId: annex.operatoryIds[4] }))
        expect(response.status).toBe(503)
        expect(response.body.message).toBe('The schedule is very busy right now. Please try again.')
        // Three attempts of about one second each: it did wait and retry, not fail at once.
        expect(Date.now() - started).toBeGreaterThanOrEqual(2_900)
      } finally {
        await release()
      }
      expect(await visitsAt(annex.operatoryIds[4]!, startUtc)).toBe(0)
    })

    it('books once the lock is let go during a retry', async () => {
      const startUtc = atAhead(2, FRIDAY, '11:00', annex.timeZone)
      const release = await holdChair(annex.operatoryIds[5]!)
      const pending = onImpatient.post('/api/visits', annexBooking(2, { startUtc, operatoryId: annex.operatoryIds[5] }))
      await waitForLockRetry(annex.operatoryIds[5]!)
      await release()
      expect((await pending).status).toBe(201)
      expect(await visitsAt(annex.operatoryIds[5]!, startUtc)).toBe(1)
    })
  })
})

describe('patients for booking', () => {
  it('finds patients by name, birth date and phone digits, and registers a new one with validation', async () => {
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    const someone = await testDb()('patients').whereNotNull('phone').orderBy('id').first()
    const byName = await desk.get(`/api/patients?q=${encodeURIComponent(someone.last_name)}`)
    expect(byName.body.some((patient: { id: number }) => patient.id === someone.id)).toBe(true)
    const born: string = someone.date_of_birth
    expect((await desk.get(`/api/patients?q=${born}`)).body.some((patient: { id: number }) => patient.id === someone.id)).toBe(true)
    const digits = someone.phone.replace(/\D/g, '')
    expect((await desk.get(`/api/patients?q=${digits}`)).body.some((patient: { id: number }) => patient.id === someone.id)).toBe(true)
    expect((await desk.get('/api/patients?q=a')).status).toBe(400)

    const created = await desk.post('/api/patients', { firstName: 'Ola', lastName: 'Testperson', dateOfBirth: '1990-05-06', email: 'ola.testperson@fernhollow.test', emailConsent: true })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ firstName: 'Ola', emailConsent: true })
    const bad = await desk.post('/api/patients', { firstName: 'Ola', lastName: 'Testperson', dateOfBirth: '1990-02-31' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.field).toBe('dateOfBirth')
    const noEmail = await desk.post('/api/patients', { firstName: 'Ola', lastName: 'Testperson', dateOfBirth: '1990-02-03', emailConsent: true })
    expect(noEmail.body.data.field).toBe('emailConsent')
  })
})

describe('refusals name times on the site\'s clock and in its date order (issue 14)', () => {
  // Two test sites: one left on the defaults (12-hour clock, month first), one set to a 24-hour clock
  // with the day first. Each refusal is checked against the text the shared formatter makes from the
  // site's stored settings, and against the shape a reader of that site expects.
  const TWELVE_HOUR = / from \w{3}, \w{3} \d{1,2}, \d{1,2}:\d{2} [AP]M to \d{1,2}:\d{2} [AP]M\.$/
  const TWENTY_FOUR_HOUR = / from \w{3} \d{1,2} \w{3}, \d{2}:\d{2} to \d{2}:\d{2}\.$/

  it.each([
    ['12-hour clock, month first', 'America/Denver', null, TWELVE_HOUR],
    ['24-hour clock, day first', 'Europe/Berlin', { clock: '24h', date_order: 'day-month-year' }, TWENTY_FOUR_HOUR],
  ] as const)('a site with a %s', async (_name, timeZone, settings, shape) => {
    const admin = await signedInAs('admin@fernhollow.test')
    const site = await createAnnex({ rooms: 2, providers: 2, patients: 3, timeZone })
    if (settings) await testDb()('sites').where({ id: site.siteId }).update(settings)
    const stored = (await admin.get(`/api/sites/${site.siteId}`)).body as DisplayStyle
    const style: DisplayStyle = { timeZone: stored.timeZone, clock: stored.clock, dateOrder: stored.dateOrder }
    const body = (operatory: number, provider: number, patient: number, startUtc: string) => ({
      siteId: site.siteId, operatoryId: site.operatoryIds[operatory], providerId: site.providerIds[provider], patientId: site.patientIds[patient], items: FILLING, startUtc,
    })
    const startUtc = atAhead(3, TUESDAY, '14:30', timeZone)
    expect((await admin.post('/api/visits', body(0, 0, 0, startUtc))).status).toBe(201)
    const span = (response: { body: { data: { conflict: { startUtc: string; endUtc: string } } } }) =>
      `${formatDateTime(response.body.data.conflict.startUtc, style)} to ${formatTime(response.body.data.conflict.endUtc, style)}`

    const chairTaken = await admin.post('/api/visits', body(0, 1, 1, startUtc))
    expect(chairTaken.status).toBe(409)
    expect(chairTaken.body.message).toBe(`Room 1 is already taken from ${span(chairTaken)}.`)
    expect(chairTaken.body.message).toMatch(shape)
    const providerBusy = await admin.post('/api/visits', body(1, 0, 1, startUtc))
    expect(providerBusy.status).toBe(409)
    expect(providerBusy.body.message).toMatch(/^Dr\. Annex \S+ is already working with another patient from /)
    expect(providerBusy.body.message.endsWith(` from ${span(providerBusy)}.`)).toBe(true)
    expect(providerBusy.body.message).toMatch(shape)
    const patientBooked = await admin.post('/api/visits', body(1, 1, 0, startUtc))
    expect(patientBooked.status).toBe(409)
    expect(patientBooked.body.message).toBe(`This patient already has a visit from ${span(patientBooked)}.`)

    // A blocked chair names the asked-for time the same way ('…during Tue, Dec 15, 9:00 AM–9:50 AM.').
    const blockedDay = weekdayAhead(3, WEDNESDAY, timeZone)
    await testDb()('blocks').insert({ site_id: site.siteId, operatory_id: site.operatoryIds[1], start_date: blockedDay, local_start: '08:00', local_end: '12:00', reason: 'Chair service' })
    const blocked = await admin.post('/api/visits', body(1, 1, 2, atAhead(3, WEDNESDAY, '09:00', timeZone)))
    expect(blocked.status).toBe(409)
    const { conflict } = blocked.body.data as { conflict: { startUtc: string; endUtc: string } }
    expect(blocked.body.message).toBe(`Room 2 is closed or blocked during ${formatDateTime(conflict.startUtc, style)}–${formatTime(conflict.endUtc, style)}.`)
    expect(blocked.body.message).toMatch(settings ? /, 09:00–\d{2}:\d{2}\.$/ : /, 9:00 AM–\d{1,2}:\d{2} [AP]M\.$/)
  })
})

