// Patient records (issue 16): edit with the row version, duplicate checks, merge, the merged-away id,
// the visit history and the audit log.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { randomUUID } from 'node:crypto'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, createTestUser, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { atAhead, TUESDAY, WEDNESDAY } from '../helpers/dates'
import { formatDateTime } from '../../shared/utils/display-time'

let admin: ApiClient
let desk: ApiClient
let annex: Annex
const tag = randomUUID().slice(0, 6)

beforeAll(async () => {
  admin = await signedInAs('admin@fernhollow.test')
  desk = await signedInAs('desk.quarry@fernhollow.test')
  annex = await createAnnex({ rooms: 2, providers: 2, patients: 0 })
})
afterAll(async () => { await closeTestDb() })

async function register(body: Record<string, unknown>) {
  const created = await admin.post('/api/patients', { dateOfBirth: '1984-07-09', ...body })
  expect(created.status, JSON.stringify(created.body)).toBe(201)
  return created.body as { id: number; rowVersion: number } & Record<string, unknown>
}

function book(patientId: number, startUtc: string, room = 0) {
  return admin.post('/api/visits', { patientId, siteId: annex.siteId, operatoryId: annex.operatoryIds[room], providerId: annex.providerIds[room], startUtc, items: FILLING })
}

describe('patient records', () => {
  it('stores phones in E.164, saves an edit with the version, refuses a stale one with 409, and audits the old values', async () => {
    const created = await register({ firstName: 'Odile', lastName: `Recordtest${tag}`, phone: '(209) 555-0163', email: `odile.${tag}@fernhollow.test`, emailConsent: true })
    expect(created).toMatchObject({ phone: '+12095550163', emailConsent: true, emailConsentSource: 'desk', rowVersion: 1 })
    const opened = await desk.get(`/api/patients/${created.id}`)
    const edit = {
      ...opened.body, preferredName: 'Odi', phone: '+1 307 555 0144', addressStreet: '3 Lantern Row', addressCity: 'Fernhollow',
      smsConsent: true, smsConsentSource: 'form', guardianName: '', alertText: 'check premedication with the dentist', frontDeskNote: 'prefers mornings',
    }
    const saved = await desk.patch(`/api/patients/${created.id}`, edit)
    expect(saved.status, JSON.stringify(saved.body)).toBe(200)
    expect(saved.body).toMatchObject({ preferredName: 'Odi', phone: '+13075550144', smsConsent: true, smsConsentSource: 'form', guardianName: null, rowVersion: 2 })
    expect(saved.body.smsConsentAt).toMatch(/Z$/)

    const stale = await desk.patch(`/api/patients/${created.id}`, { ...edit, preferredName: 'Dee' })
    expect(stale.status).toBe(409)
    expect(stale.body.data.field).toBe('rowVersion')
    expect(stale.body.message).toContain('Someone else saved')

    const audit = await testDb()('audit_log').where({ entity: 'patient', entity_id: String(created.id), action: 'patient_changed' }).first()
    const before = typeof audit.before === 'string' ? JSON.parse(audit.before) : audit.before
    expect(before).toMatchObject({ preferredName: null, phone: '+12095550163', alertText: null })
  })

  it('answers 400 naming the field for a bad phone, a missing consent source and a future birth date; 403 for a dentist', async () => {
    const created = await register({ firstName: 'Pell', lastName: `Recordtest${tag}` })
    const record = (await admin.get(`/api/patients/${created.id}`)).body
    expect((await admin.patch(`/api/patients/${created.id}`, { ...record, phone: '555-01' })).body.data.field).toBe('phone')
    expect((await admin.patch(`/api/patients/${created.id}`, { ...record, email: 'p@fernhollow.test', emailConsent: true, emailConsentSource: null })).body.data.field).toBe('emailConsentSource')
    expect((await admin.patch(`/api/patients/${created.id}`, { ...record, dateOfBirth: '2999-01-01' })).status).toBe(400)
    const dentist = await signedInAs('dentist@fernhollow.test')
    expect((await dentist.patch(`/api/patients/${created.id}`, record)).status).toBe(403)
  })

  it('shows the alert on the board visit', async () => {
    const created = await register({ firstName: 'Alma', lastName: `Alerttest${tag}`, alertText: 'needs premedication' })
    const startUtc = atAhead(3, TUESDAY, '09:00', annex.timeZone)
    expect((await book(created.id, startUtc)).status).toBe(201)
    const visits = await admin.get(`/api/visits?siteId=${annex.siteId}&fromUtc=${startUtc}&toUtc=${new Date(Date.parse(startUtc) + 3_600_000).toISOString()}`)
    expect(visits.body.find((visit: { patientId: number }) => visit.patientId === created.id).patientAlert).toBe('needs premedication')
  })
})

describe('duplicates', () => {
  it('finds the same e-mail in another case, the same phone typed otherwise, an accented or one-letter-off name with the same birth date', async () => {
    const known = await register({ firstName: 'Zoë', lastName: `Dupcheck${tag}`, email: `zoe.${tag}@fernhollow.test`, phone: '(520) 555-0119' })
    const ask = (query: Record<string, string>) => desk.get(`/api/patients/duplicates?${new URLSearchParams({ firstName: 'X', lastName: 'Y', dateOfBirth: '1990-01-01', ...query })}`)
    const ids = (answer: { body: { patient: { id: number } }[] }) => answer.body.map((candidate) => candidate.patient.id)
    expect(ids(await ask({ email: `ZOE.${tag}@Fernhollow.TEST` }))).toContain(known.id)
    expect(ids(await ask({ phone: '+1 520 555 0119' }))).toContain(known.id)
    const byName = await ask({ firstName: 'zoe', lastName: `dup check${tag}`, dateOfBirth: '1984-07-09' })
    expect(byName.body.find((candidate: { patient: { id: number } }) => candidate.patient.id === known.id).reasons).toEqual(['name_and_birth_date'])
    expect(ids(await ask({ firstName: 'Zoe', lastName: `Dupchek${tag}`, dateOfBirth: '1984-07-09' }))).toContain(known.id)
    expect(ids(await ask({ firstName: 'Zoe', lastName: `Dupcheck${tag}`, dateOfBirth: '1984-07-10' }))).not.toContain(known.id)
    expect(ids(await ask({ firstName: 'Zoe', lastName: `Dupcheck${tag}`, dateOfBirth: '1984-07-09', exceptId: String(known.id) }))).not.toContain(known.id)
    expect((await ask({ phone: 'not a phone' })).body.data.field).toBe('phone')
  })
})

describe('merge', () => {
  it('moves visits, outbox rows and the audit trail to the survivor, keeps a merge record, and answers the old id with the survivor', async () => {
    const keep = await register({ firstName: 'Ines', lastName: `Mergetest${tag}`, phone: '(209) 555-0150' })
    const gone = await register({ firstName: 'Inés', lastName: `Mergetest${tag}`, email: `ines.${tag}@fernhollow.test`, emailConsent: true })
    const first = await book(keep.id, atAhead(4, TUESDAY, '09:00', annex.timeZone))
    const second = await book(gone.id, atAhead(4, WEDNESDAY, '09:00', annex.timeZone))
    expect([first.status, second.status]).toEqual([201, 201])
    await admin.get(`/api/patients/${gone.id}`) // an opening on the merged-away record

    expect((await desk.post('/api/patient-merges', { survivorId: keep.id, mergedId: gone.id })).status).toBe(403)
    const merged = await admin.post('/api/patient-merges', { survivorId: keep.id, mergedId: gone.id, take: { email: 'merged', emailConsent: 'merged' } })
    expect(merged.status, JSON.stringify(merged.body)).toBe(201)
    expect(merged.body.survivor).toMatchObject({ id: keep.id, firstName: 'Ines', email: `ines.${tag}@fernhollow.test`, emailConsent: true, phone: '+12095550150' })
    expect(merged.body.movedVisitIds).toEqual([second.body.id])

    const db = testDb()
    expect(await db('visits').where({ patient_id: gone.id }).count({ n: '*' })).toEqual([{ n: 0 }])
    expect((await db('visits').where({ id: second.body.id }).first()).patient_id).toBe(keep.id)
    const outbox = await db('outbox').where({ visit_id: second.body.id })
    expect(outbox.length).toBeGreaterThan(0)
    expect(await db('audit_log').where({ entity: 'patient', entity_id: String(gone.id) }).count({ n: '*' })).toEqual([{ n: 0 }])
    expect((await db('audit_log').where({ entity: 'patient', entity_id: String(keep.id), action: 'patient_opened' })).length).toBeGreaterThanOrEqual(1)
    expect(await db('patient_merges').where({ survivor_id: keep.id, merged_id: gone.id }).first()).toBeTruthy()

    const old = await admin.get(`/api/patients/${gone.id}`)
    expect(old.status).toBe(308)
    expect(old.body).toEqual({ mergedInto: keep.id })
    expect(old.headers.get('location')).toBe(`/api/patients/${keep.id}`)
    expect((await admin.patch(`/api/patients/${gone.id}`, { ...merged.body.survivor, rowVersion: 2 })).status).toBe(409)
    const history = await admin.get(`/api/patients/${keep.id}/visits`)
    expect(history.body.map((visit: { id: number }) => visit.id).sort()).toEqual([first.body.id, second.body.id].sort())
    const search = await admin.get(`/api/patients?q=Mergetest${tag}`)
    expect(search.body.map((patient: { id: number }) => patient.id)).toEqual([keep.id])
  })

  it('recalls and recall intervals follow the person: a kind only the merged-away record had moves, where both had one the survivor keeps its own', async () => {
    const keep = await register({ firstName: 'Rhea', lastName: `Recallmerge${tag}` })
    const gone = await register({ firstName: 'Rhéa', lastName: `Recallmerge${tag}` })
    const db = testDb()
    await db('recalls').insert([
      { patient_id: keep.id, kind: 'cleaning', due_date: '2030-01-15' },
      { patient_id: gone.id, kind: 'cleaning', due_date: '2030-02-15' },
      { patient_id: gone.id, kind: 'exam', due_date: '2030-03-15' },
    ])
    await db('patient_recall_intervals').insert({ patient_id: gone.id, kind: 'exam', months: 9 })
    const merged = await admin.post('/api/patient-merges', { survivorId: keep.id, mergedId: gone.id })
    expect(merged.status, JSON.stringify(merged.body)).toBe(201)
    const recalls = await db('recalls').whereIn('patient_id', [keep.id, gone.id]).orderBy('kind').select('patient_id', 'kind', 'due_date')
    expect(recalls.map((row) => [row.patient_id, row.kind])).toEqual([[keep.id, 'cleaning'], [keep.id, 'exam']])
    expect(await db('patient_recall_intervals').whereIn('patient_id', [keep.id, gone.id]).select('patient_id', 'kind', 'months')).toEqual([{ patient_id: keep.id, kind: 'exam', months: 9 }])
    const record = await db('patient_merges').where({ survivor_id: keep.id, merged_id: gone.id }).first()
    expect(typeof record.moved === 'string' ? JSON.parse(record.moved) : record.moved).toMatchObject({ recalls: 1, recallIntervals: 1, waitlistEntries: 0 })
  })

  it('refuses with 409 naming the visits when the two records have visits at the same time', async () => {
    const one = await register({ firstName: 'Tomas', lastName: `Overlap${tag}` })
    const two = await register({ firstName: 'Tomás', lastName: `Overlap${tag}` })
    const startUtc = atAhead(5, TUESDAY, '10:00', annex.timeZone)
    const a = await book(one.id, startUtc, 0)
    const b = await book(two.id, startUtc, 1)
    expect([a.status, b.status]).toEqual([201, 201])
    const refused = await admin.post('/api/patient-merges', { survivorId: one.id, mergedId: two.id })
    expect(refused.status).toBe(409)
    expect(refused.body.message).toContain(`visit ${a.body.id} and visit ${b.body.id}`)
    // The time as the site shows it (its clock and date order), through the one shared formatter.
    const site = await testDb()('sites').where({ id: annex.siteId }).first('time_zone', 'clock', 'date_order', 'name')
    expect(refused.body.message).toContain(`(${formatDateTime(startUtc, { timeZone: site.time_zone, clock: site.clock, dateOrder: site.date_order }, 'short')}, ${site.name})`)
    expect(refused.body.data.visitIds).toEqual([a.body.id, b.body.id])
    expect((await testDb()('visits').where({ id: b.body.id }).first()).patient_id).toBe(two.id)
  })
})

describe('audit', () => {
  it('lists a patient\'s entries for managers and admins, with who, address and before → after, and refuses the front desk', async () => {
    const created = await register({ firstName: 'Uma', lastName: `Audittest${tag}` })
    const record = (await admin.get(`/api/patients/${created.id}`)).body
    await admin.patch(`/api/patients/${created.id}`, { ...record, preferredName: 'U' })
    const page = await admin.get(`/api/audit?patientId=${created.id}`)
    expect(page.status).toBe(200)
    const actions = page.body.entries.map((entry: { action: string }) => entry.action)
    expect(actions).toEqual(['patient_changed', 'patient_opened', 'patient_created'])
    expect(page.body.entries[0]).toMatchObject({ userName: expect.any(String), before: { preferredName: null }, after: { preferredName: 'U' } })
    expect(page.body.entries[0].ip).toBeTruthy()
    expect((await desk.get(`/api/audit?patientId=${created.id}`)).status).toBe(403)
    expect((await admin.get('/api/audit?from=2026-13-01')).body.data.field).toBe('from')
    const manager = await signedInAs('manager@fernhollow.test')
    expect((await manager.get(`/api/audit?siteId=${annex.siteId}&page=1`)).status).toBe(200)
  })

  it('shows a manager of one site only that site\'s entries', async () => {
    const scoped = await createTestUser({ role: 'manager', siteSlugs: ['quarry-street'] })
    const client = new ApiClient()
    await client.signIn(scoped.email, scoped.password)
    // Another site's entries: 403; no site named: their only site, never the whole group's log.
    expect((await client.get(`/api/audit?siteId=${annex.siteId}`)).status).toBe(403)
    const own = await client.get('/api/audit')
    expect(own.status).toBe(200)
    const quarry = (await testDb()('sites').where({ slug: 'quarry-street' }).first('id')).id
    expect((await client.get(`/api/audit?siteId=${quarry}`)).body.total).toBe(own.body.total)
    const twoSites = await createTestUser({ role: 'manager', siteSlugs: ['quarry-street', 'aspen-gulch'] })
    const other = new ApiClient()
    await other.signIn(twoSites.email, twoSites.password)
    const unnamed = await other.get('/api/audit')
    expect(unnamed.status).toBe(400)
    expect(unnamed.body.data.field).toBe('siteId')
  })
})
