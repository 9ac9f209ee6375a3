// Issue 11 §6: time-off reasons only for those who manage the provider; group-wide templates only for
// admins and managers of all sites; time off only for providers at a site the manager covers;
// every opening of a patient's record is audited; rota and room writes retry a lock wait like a booking.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { startAppServer, type RunningServer } from '../helpers/app-server'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'
import { createAnnex, type Annex } from '../helpers/booking-fixtures'
import { createStaff, STAFF_PASSWORD } from '../helpers/midday'
import { daysFromToday } from '../helpers/dates'

const SECRET = 'CONFIDENTIAL medical leave'
let quarry: number
let aspen: number
let quarryManager: ApiClient
let aspenManager: ApiClient

async function signIn(email: string) {
  const client = new ApiClient()
  await client.signIn(email, STAFF_PASSWORD)
  return client
}

beforeAll(async () => {
  quarry = await siteIdBySlug('quarry-street')
  aspen = await siteIdBySlug('aspen-gulch')
  quarryManager = await signIn((await createStaff('manager', [quarry])).email)
  aspenManager = await signIn((await createStaff('manager', [aspen])).email)
})
afterAll(async () => { await closeTestDb() })

describe('time-off reasons', () => {
  let providerId: number
  let ownClient: ApiClient
  const day = daysFromToday(30)

  beforeAll(async () => {
    const provider = await createStaff('hygienist', [quarry], { provider: true })
    providerId = provider.providerId!
    ownClient = await signIn(provider.email)
    const admin = await signedInAs('admin@fernhollow.test')
    for (const siteId of [quarry, null]) {
      const saved = await admin.post('/api/shift-exceptions', { providerId, siteId, kind: 'time_off', startDate: day, endDate: day, reason: SECRET })
      expect(saved.status, JSON.stringify(saved.body)).toBe(201)
    }
  })

  async function reasonsSeenBy(client: ApiClient) {
    const listed = await client.get(`/api/shift-exceptions?providerId=${providerId}`)
    expect(listed.status).toBe(200)
    return [...new Set((listed.body as Array<{ reason: string }>).map((exception) => exception.reason))]
  }

  it('are shown to admins, all-site managers, managers of the provider\'s site and the provider', async () => {
    for (const client of [await signedInAs('admin@fernhollow.test'), await signedInAs('manager@fernhollow.test'), quarryManager, ownClient]) {
      expect(await reasonsSeenBy(client)).toEqual([SECRET])
    }
  })

  it('read "away" for the front desk, other providers and a manager of another site', async () => {
    for (const client of [await signedInAs('desk.quarry@fernhollow.test'), await signedInAs('dentist@fernhollow.test'), await signedInAs('hygienist@fernhollow.test'), aspenManager]) {
      const seen = await reasonsSeenBy(client)
      expect(seen.length).toBeGreaterThan(0)
      expect(seen).toEqual(['away'])
    }
  })

  it('never reach the Rota view (records or grid labels) of those who may not read them', async () => {
    for (const email of ['desk.quarry@fernhollow.test', 'dentist@fernhollow.test', 'hygienist@fernhollow.test']) {
      const rota = await (await signedInAs(email)).get(`/api/rota?providerId=${providerId}&from=${day}&to=${day}`)
      expect(rota.status).toBe(200)
      expect(rota.body.exceptions.length).toBeGreaterThan(0)
      expect(JSON.stringify(rota.body)).not.toContain('CONFIDENTIAL')
    }
    const managed = await quarryManager.get(`/api/rota?providerId=${providerId}&from=${day}&to=${day}`)
    expect(JSON.stringify(managed.body)).toContain(SECRET)
  })
})

describe('group-wide templates', () => {
  const template = (code: string) => ({
    code, name: `Scope ${code}`, category: 'restorative', capability: 'restorative', needsTooth: true, needsSurfaces: true, region: 'posterior',
    steps: [
      { label: 'Seat', kind: 'assist', role: 'seat', baseMinutes: 5, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
      { label: 'Restore', kind: 'hands_on', role: 'treat', baseMinutes: 20, perExtraSurfaceMinutes: 10, perExtraToothMinutes: 0 },
    ],
    anaesthesia: {
      required: false,
      maxillary: { technique: 'infiltration', infiltration: { injectMinutes: 2, onsetMinutes: 3 }, block: { injectMinutes: 2, onsetMinutes: 10 } },
      mandibular: { technique: 'block', infiltration: { injectMinutes: 2, onsetMinutes: 3 }, block: { injectMinutes: 2, onsetMinutes: 10 } },
    },
  })
  const REFUSAL = 'Templates are shared by every site: only admins and managers of all sites may change them.'

  it('a manager of one site may not create, edit or deactivate them: 403 in words', async () => {
    const code = `SCOPE-${Date.now() % 100_000}`
    const created = await quarryManager.post('/api/templates', template(code))
    expect(created.status).toBe(403)
    expect(created.body.message).toBe(REFUSAL)
    const existing = (await quarryManager.get('/api/templates')).body.find((entry: { code: string }) => entry.code === 'COMP-POST')
    const edited = await quarryManager.put(`/api/templates/${existing.id}`, template('COMP-POST'))
    expect(edited.status).toBe(403)
    expect(edited.body.message).toBe(REFUSAL)
    expect((await quarryManager.delete(`/api/templates/${existing.id}`)).status).toBe(403)
    expect(Number((await testDb()('procedure_templates').where({ code }).count({ n: '*' }).first())!.n)).toBe(0)
    expect((await quarryManager.get(`/api/templates/${existing.id}`)).body.active).toBe(true)
  })

  it('a manager of all sites may', async () => {
    const manager = await signedInAs('manager@fernhollow.test')
    const created = await manager.post('/api/templates', template(`ALL-${Date.now() % 100_000}`))
    expect(created.status).toBe(201)
    expect((await manager.delete(`/api/templates/${created.body.id}`)).body.active).toBe(false)
  })
})

describe('time off kept by the provider\'s own managers', () => {
  it('a manager of Quarry Street may not add time off for a hygienist who works only at Aspen Gulch', async () => {
    const elsewhere = await createStaff('hygienist', [aspen], { provider: true })
    const day = daysFromToday(40)
    for (const siteId of [quarry, null]) {
      const response = await quarryManager.post('/api/shift-exceptions', { providerId: elsewhere.providerId, siteId, kind: 'time_off', startDate: day, endDate: day, reason: 'Course' })
      expect(response.status).toBe(403)
      expect(response.body.message).toMatch(/works at none of your sites: their own sites' managers keep their time off\.$/)
    }
    expect(Number((await testDb()('shift_exceptions').where({ provider_id: elsewhere.providerId }).count({ n: '*' }).first())!.n)).toBe(0)
    // Their own site's manager may, at their site; a site they do not work at is refused in words.
    expect((await aspenManager.post('/api/shift-exceptions', { providerId: elsewhere.providerId, siteId: aspen, kind: 'time_off', startDate: day, endDate: day, reason: 'Course' })).status).toBe(201)
    const wrongSite = await (await signedInAs('admin@fernhollow.test')).post('/api/shift-exceptions', { providerId: elsewhere.providerId, siteId: quarry, kind: 'time_off', startDate: day, endDate: day })
    expect(wrongSite.status).toBe(400)
    expect(wrongSite.body.data.field).toBe('providerId')
  })
})

describe('opening a patient\'s record', () => {
  it('writes an audit row naming who opened which record', async () => {
    const patient = await testDb()('patients').orderBy('id').first('id')
    const desk = await signedInAs('desk.aspen@fernhollow.test')
    const deskUser = await testDb()('users').where({ email: 'desk.aspen@fernhollow.test' }).first('id')
    const before = Number((await testDb()('audit_log').where({ action: 'patient_opened', entity_id: String(patient.id), user_id: deskUser.id }).count({ n: '*' }).first())!.n)
    const opened = await desk.get(`/api/patients/${patient.id}`)
    expect(opened.status).toBe(200)
    const rows = await testDb()('audit_log').where({ action: 'patient_opened', entity: 'patient', entity_id: String(patient.id), user_id: deskUser.id })
    expect(rows.length).toBe(before + 1)
  })
})

describe('a rota write while a booking burst holds the site row', () => {
  let impatient: RunningServer
  let onImpatient: ApiClient
  let annex: Annex
  beforeAll(async () => {
    annex = await createAnnex({ rooms: 1, providers: 0, patients: 0 })
    // This server waits one second for a row lock (MariaDB error 1205 after that), then retries.
    impatient = await startAppServer({ NUXT_DB_LOCK_WAIT_SECONDS: '1' })
    onImpatient = new ApiClient(impatient.url)
    await onImpatient.signIn('manager@fernhollow.test')
  })
  afterAll(async () => { await impatient?.stop() })

  /** Holds the site row the way a booking in flight does (a shift's trigger must write it). */
  async function holdSite(siteId: number) {
    const trx = await testDb().transaction()
    await trx('sites').where({ id: siteId }).forUpdate().first('id')
    return () => trx.rollback()
  }

  it('is retried, then answered 503 in words, never 500, and saves nothing', async () => {
    const provider = await createStaff('dentist', [annex.siteId], { provider: true })
    const shift = { providerId: provider.providerId, siteId: annex.siteId, rrule: 'FREQ=WEEKLY;BYDAY=MO', validFrom: daysFromToday(7), localStart: '08:00', localEnd: '12:00' }
    const release = await holdSite(annex.siteId)
    try {
      const response = await onImpatient.post('/api/shifts', shift)
      expect(response.status).toBe(503)
      expect(response.body.message).toBe('The schedule is very busy right now. Please try again.')
    } finally {
      await release()
    }
    expect(Number((await testDb()('shifts').where({ provider_id: provider.providerId }).count({ n: '*' }).first())!.n)).toBe(0)
    expect((await onImpatient.post('/api/shifts', shift)).status).toBe(201)
  })

  it('a room added while the site row is held also waits and answers 503, not 500', async () => {
    const release = await holdSite(annex.siteId)
    try {
      const response = await onImpatient.post('/api/operatories', { siteId: annex.siteId, name: 'Room busy', capabilities: ['hygiene'] })
      expect(response.status).toBe(503)
    } finally {
      await release()
    }
  })
})
