// Bounded work per request and no 500 for anything a caller can send (issue 11 §2, §3, §6):
// dates and windows, id bounds, bad percent-encoding on patient links, body size, control
// characters in text, and idempotency keys compared byte for byte.
import { request as httpRequest } from 'node:http'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { daysFromToday, MONDAY, weekdayAhead } from '../helpers/dates'

const FAR = '9999-12-31'
let admin: ApiClient
let desk: ApiClient
let quarryId: number
let annex: Annex
let visit: { id: number; rowVersion: number }

beforeAll(async () => {
  admin = await signedInAs('admin@fernhollow.test')
  desk = await signedInAs('desk.quarry@fernhollow.test')
  quarryId = await siteIdBySlug('quarry-street')
  annex = await createAnnex({ rooms: 2, patients: 4 })
  const booked = await admin.post('/api/visits', {
    patientId: annex.patientIds[3], siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0],
    startUtc: `${weekdayAhead(4, MONDAY, annex.timeZone)}T15:00:00Z`, items: FILLING,
  })
  if (booked.status !== 201) throw new Error(`could not book the test visit: ${JSON.stringify(booked.body)}`)
  visit = { id: booked.body.id, rowVersion: booked.body.rowVersion }
})
afterAll(closeTestDb)

function expect400(response: { status: number; body: any }, field: string) {
  expect(response.status, JSON.stringify(response.body)).toBe(400)
  expect(response.body.data?.field ?? response.body.message).toContain(field)
}

/** A later instant than any booking may have: three years and a bit from today. */
const tooLateInstant = () => `${daysFromToday(3 * 366 + 2)}T15:00:00Z`

describe('dates and windows on range routes', () => {
  it('rota: year 9999 is a 400 naming the field, not seconds of work', async () => {
    expect400(await desk.get(`/api/rota?siteId=${quarryId}&from=9999-12-25&to=${FAR}`), 'from')
    expect400(await desk.get(`/api/rota?siteId=${quarryId}&from=1999-12-31&to=2000-01-02`), 'from')
  })

  it('rota: a window longer than 93 days is refused in the schema; a month is answered', async () => {
    // (The rota view service has its own, shorter limit of 42 days; the schema's 93 is the outer bound.)
    const from = daysFromToday(0)
    expect400(await desk.get(`/api/rota?siteId=${quarryId}&from=${from}&to=${daysFromToday(93)}`), 'to')
    const ok = await desk.get(`/api/rota?siteId=${quarryId}&from=${from}&to=${daysFromToday(30)}`)
    expect(ok.status, JSON.stringify(ok.body)).toBe(200)
    expect(Array.isArray(ok.body.entries)).toBe(true)
  })

  it('availability: far-future dates, instants (local dates only) and long windows are 400', async () => {
    expect400(await desk.get(`/api/availability?siteId=${quarryId}&from=9999-12-25&to=${FAR}`), 'from')
    expect400(await desk.get(`/api/availability?siteId=${quarryId}&from=${daysFromToday(1)}&to=9999-12-31T23:00:00Z`), 'to')
    expect400(await desk.get(`/api/availability?siteId=${quarryId}&from=${daysFromToday(1)}T00:00:00Z&to=${daysFromToday(2)}`), 'from')
    expect400(await desk.get(`/api/availability?siteId=${quarryId}&from=${daysFromToday(1)}&to=${daysFromToday(200)}`), 'to')
    const ok = await desk.get(`/api/availability?siteId=${quarryId}&from=${daysFromToday(1)}&to=${daysFromToday(7)}`)
    expect(ok.status).toBe(200)
  })

  it('availability: 93 local days across the autumn clock change are answered (an hour more than 93 × 24 h)', async () => {
    const year = new Date().getUTCFullYear() + 1
    const ok = await desk.get(`/api/availability?siteId=${quarryId}&from=${year}-09-01&to=${year}-12-02`)
    expect(ok.status, JSON.stringify(ok.body)).toBe(200)
  })

  it('openings: year 9999 is a 400 naming from', async () => {
    expect400(await desk.post('/api/openings', { items: FILLING, from: '9999-12-25', to: FAR }), 'from')
  })

  it('balance: year 9999 is a 400 naming from', async () => {
    expect400(await admin.get(`/api/balance?from=9999-12-25&to=${FAR}`), 'from')
  })

  it('visit list: year 9999 instants are a 400 naming from', async () => {
    expect400(await desk.get(`/api/visits?siteId=${quarryId}&fromUtc=9999-12-25T00:00:00Z&toUtc=9999-12-31T00:00:00Z`), 'fromUtc')
  })

  it('shifts, time off and blocks refuse dates outside the bounds', async () => {
    const provider = await testDb()('providers').first('id')
    expect400(await admin.post('/api/shifts', {
      providerId: provider.id, siteId: quarryId, rrule: 'FREQ=WEEKLY;BYDAY=MO', validFrom: FAR, localStart: '08:00', localEnd: '12:00',
    }), 'validFrom')
    expect400(await admin.post('/api/shift-exceptions', { providerId: provider.id, kind: 'time_off', siteId: quarryId, startDate: daysFromToday(3), endDate: FAR }), 'endDate')
    expect400(await admin.post('/api/blocks', { siteId: quarryId, startDate: '1970-01-01', localStart: '08:00', localEnd: '09:00', reason: 'Staff meeting' }), 'startDate')
  })
})

describe('visit starts', () => {
  it('POST /api/visits with startUtc 9999-12-31T23:50:00Z is a 400 naming startUtc', async () => {
    expect400(await desk.post('/api/visits', {
      patientId: annex.patientIds[0], siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0],
      startUtc: '9999-12-31T23:50:00Z', items: FILLING,
    }), 'startUtc')
  })

  it('PATCH /api/visits/:id with startUtc 9999-12-31T23:50:00Z is a 400 naming startUtc', async () => {
    expect400(await admin.patch(`/api/visits/${visit.id}`, { rowVersion: visit.rowVersion, startUtc: '9999-12-31T23:50:00Z' }), 'startUtc')
  })

  it('a start more than three years ahead is a 400 naming startUtc', async () => {
    expect400(await desk.post('/api/visits', {
      patientId: annex.patientIds[0], siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0],
      startUtc: tooLateInstant(), items: FILLING,
    }), 'startUtc')
  })
})

describe('the longest visit, 8 hours (MAX_VISIT_MINUTES; the overlap reads rely on it)', () => {
  // Eight large molar fillings: 550 minutes of chair time.
  const eightFillings = ['2', '3', '14', '15', '18', '19', '30', '31'].map((tooth) => ({ templateCode: 'COMP-POST', tooth, surfaces: 'MODB' }))

  it('POST /api/visits with a longer plan is a 400 naming items, saying why in plain words', async () => {
    const response = await admin.post('/api/visits', {
      patientId: annex.patientIds[0], siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0],
      startUtc: `${weekdayAhead(5, MONDAY, annex.timeZone)}T14:00:00Z`, items: eightFillings,
    })
    expect400(response, 'items')
    expect(response.body.data.reason).toMatch(/need 550 minutes in the chair; one visit is at most 480 minutes \(8 hours\), so book them as two visits/)
  })

  it('an openings search for it is a 400 naming items', async () => {
    const from = weekdayAhead(5, MONDAY, annex.timeZone)
    expect400(await admin.post('/api/openings', { items: eightFillings, siteIds: [annex.siteId], from, to: from }), 'items')
  })

  it('a length set by hand past it is a 400 naming lengthOverride.chairMinutes', async () => {
    expect400(await admin.patch(`/api/visits/${visit.id}`, { rowVersion: visit.rowVersion, lengthOverride: { chairMinutes: 485, reason: 'very long sedation' } }), 'lengthOverride.chairMinutes')
  })

  it('a template whose steps alone add up to more is a 400 naming steps', async () => {
    const step = (label: string, kind: string, role: string, baseMinutes: number) => ({ label, kind, role, baseMinutes, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 })
    const timing = { injectMinutes: 2, onsetMinutes: 3 }
    const response = await admin.post('/api/templates', {
      code: 'LONG-1', name: 'Too long for one visit', category: 'restorative', capability: 'restorative',
      steps: [step('Seat', 'assist', 'seat', 10), step('Restore', 'hands_on', 'treat', 300), step('Finish', 'hands_on', 'treat', 200), step('Reset room', 'reset', 'turnover', 10)],
      anaesthesia: { required: false, maxillary: { technique: 'infiltration', infiltration: timing, block: timing }, mandibular: { technique: 'block', infiltration: timing, block: timing } },
    })
    expect400(response, 'steps')
    expect(response.body.data.reason).toMatch(/add up to 520 minutes .* at most 480 minutes/)
  })
})

describe('id bounds', () => {
  it('POST /api/patients with preferredSiteId 2147483647 is a 400 naming the field (no such site)', async () => {
    expect400(await admin.post('/api/patients', { firstName: 'Ida', lastName: 'Bound', dateOfBirth: '1990-05-05', preferredSiteId: 2147483647 }), 'preferredSiteId')
  })

  it('ids past 2^31 − 1 are 400 in bodies, queries and paths', async () => {
    expect400(await admin.post('/api/patients', { firstName: 'Ida', lastName: 'Bound', dateOfBirth: '1990-05-05', preferredSiteId: 2147483648 }), 'preferredSiteId')
    expect400(await desk.get('/api/operatories?siteId=9007199254740993'), 'siteId')
    expect400(await desk.get('/api/patients/2147483648'), 'id')
    expect((await desk.get('/api/patients/2147483647')).status).toBe(404)
  })

  it('a birth date in year 0 is a 400 naming dateOfBirth', async () => {
    expect400(await admin.post('/api/patients', { firstName: 'Ida', lastName: 'Bound', dateOfBirth: '0000-01-01' }), 'dateOfBirth')
  })
})

describe('patient links with bad percent-encoding, signed out', () => {
  const validLooking = `1.${Math.floor(Date.now() / 1000) + 86_400}.${'A'.repeat(43)}`
  const tokens = ['%ZZ', '%', '%E0%A4%A', '%C0%AE', `${validLooking}%`]
  const signedOut = () => new ApiClient()

  for (const token of tokens) {
    it(`GET, confirm and cancel with ${JSON.stringify(token)} answer 404 or 400`, async () => {
      const client = signedOut()
      for (const [method, suffix] of [['GET', ''], ['POST', '/confirm'], ['POST', '/cancel']] as const) {
        const response = await client.request(method, `/api/visit/${token}${suffix}`)
        expect([400, 404], `${method} ${suffix}: ${response.status} ${JSON.stringify(response.body)}`).toContain(response.status)
      }
    })
  }
})

/** A raw HTTP request, so the test controls Content-Length and chunking itself. */
function rawRequest(options: { method: string; path: string; headers: Record<string, string | number>; write: (req: ReturnType<typeof httpRequest>) => void }) {
  const base = new URL(inject('baseURL'))
  return new Promise<{ status: number; body: string }>((resolve, reject) => {
    const req = httpRequest({ host: base.hostname, port: base.port, method: options.method, path: options.path, headers: options.headers }, (res) => {
      let body = ''
      res.setEncoding('utf8')
      res.on('data', (chunk) => { body += chunk })
      res.on('end', () => resolve({ status: res.statusCode ?? 0, body }))
    })
    req.on('error', (error) => reject(error))
    options.write(req)
  })
}

describe('request body size', () => {
  it('a 20 MB declared body is a 413 with a plain message before sign-in, without reading it', async () => {
    const response = await rawRequest({
      method: 'POST', path: '/api/patients', headers: { 'content-type': 'application/json', 'content-length': 20 * 1024 * 1024 },
      write: (req) => { req.write('{"firstName":"'); req.end() },
    }).catch((error: Error) => ({ status: -1, body: error.message }))
    expect(response.status, response.body).toBe(413)
    expect(JSON.parse(response.body).message).toMatch(/too large.*256 KiB/)
  })

  it('a chunked body over 256 KiB is a 413 on every API route, signed in or not', async () => {
    for (const path of ['/api/auth/login', '/api/visits', '/api/visit/x/confirm']) {
      const response = await rawRequest({
        method: 'POST', path, headers: { 'content-type': 'application/json', 'transfer-encoding': 'chunked', cookie: desk.cookie },
        write: (req) => {
          const chunk = `"${'x'.repeat(64 * 1024)}",`
          req.write('[')
          for (let index = 0; index < 6; index += 1) req.write(chunk)
          req.end('""]')
        },
      }).catch((error: Error) => ({ status: -1, body: error.message }))
      expect(response.status, `${path}: ${response.body}`).toBe(413)
    }
  })

  it('a chunked body under the limit is read and validated as usual', async () => {
    const body = JSON.stringify({ firstName: 'Chunk', lastName: '', dateOfBirth: '1990-01-01' })
    const response = await rawRequest({
      method: 'POST', path: '/api/patients', headers: { 'content-type': 'application/json', 'transfer-encoding': 'chunked', cookie: desk.cookie },
      write: (req) => { req.write(body.slice(0, 10)); req.end(body.slice(10)) },
    })
    expect(response.status).toBe(400)
    expect(JSON.parse(response.body).data.field).toBe('lastName')
  })

  it('a body just under 256 KiB with a Content-Length gets past the limit (400 for its content)', async () => {
    const response = await desk.post('/api/patients', { firstName: 'x'.repeat(250 * 1024), lastName: 'Long', dateOfBirth: '1990-01-01' })
    expect400(response, 'firstName')
  })
})

describe('names and free text refuse line breaks and control characters', () => {
  const cases: Array<[string, Record<string, unknown>]> = [
    ['firstName', { firstName: 'Ann\r\nBcc: someone@example.test', lastName: 'Lee', dateOfBirth: '1990-01-01' }],
    ['lastName', { firstName: 'Ann', lastName: 'Lee\u0000', dateOfBirth: '1990-01-01' }],
    ['email', { firstName: 'Ann', lastName: 'Lee', dateOfBirth: '1990-01-01', email: 'ann@example.test\nBcc: x@example.test' }],
  ]
  for (const [field, body] of cases) {
    it(`POST /api/patients: ${field} with a control character is a 400 naming it`, async () => {
      const response = await desk.post('/api/patients', body)
      expect400(response, field)
      if (field !== 'email') expect(response.body.data.reason).toBe('must not contain line breaks or control characters')
    })
  }

  it('a cancel reason and a block reason with a line break are 400', async () => {
    expect400(await admin.post(`/api/visits/${visit.id}/cancel`, { reason: 'Patient asked\r\nX-Injected: yes' }), 'reason')
    expect400(await admin.post('/api/blocks', { siteId: quarryId, startDate: weekdayAhead(3, MONDAY), localStart: '08:00', localEnd: '09:00', reason: 'Meeting\n' + 'x\u0085' }), 'reason')
  })

  it('a staff name with a tab is a 400; plain accented names are still accepted', async () => {
    expect400(await admin.post('/api/users', { email: 'tab-name@fernhollow.test', name: 'Dana\tDoe', role: 'front_desk', siteIds: [quarryId], password: 'a-long-test-password' }), 'name')
    const fine = await desk.post('/api/patients', { firstName: 'Zoë', lastName: "O'Brien-Łukasz", dateOfBirth: '1990-01-01' })
    expect(fine.status).toBe(201)
    expect(fine.body.firstName).toBe('Zoë')
  })
})

describe('idempotency keys', () => {
  it('keys differing only in case are two keys: two different bookings both succeed', async () => {
    const day = weekdayAhead(5, MONDAY, annex.timeZone)
    const base = { patientId: annex.patientIds[1], siteId: annex.siteId, providerId: annex.providerIds[0], items: FILLING }
    const key = `Case-Key-${annex.siteId}-abc`
    const first = await admin.post('/api/visits', { ...base, operatoryId: annex.operatoryIds[0], startUtc: `${day}T15:00:00Z` }, { headers: { 'idempotency-key': key } })
    expect(first.status, JSON.stringify(first.body)).toBe(201)
    const second = await admin.post('/api/visits', { ...base, patientId: annex.patientIds[2], operatoryId: annex.operatoryIds[1], startUtc: `${day}T18:00:00Z` }, { headers: { 'idempotency-key': key.toLowerCase() } })
    expect(second.status, JSON.stringify(second.body)).toBe(201)
    expect(second.body.id).not.toBe(first.body.id)
    const keys = await testDb()('idempotency_keys').whereIn('idempotency_key', [key, key.toLowerCase()]).pluck('idempotency_key')
    expect(keys.sort()).toEqual([key, key.toLowerCase()].sort())
  })
})
