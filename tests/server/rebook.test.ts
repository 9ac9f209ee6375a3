// The Rebook list (issue 13 §2): GET /api/rebook lists a site's stranded visits with patient, phone,
// original time and reason; moving one to a time that holds, or cancelling it, clears the flag and
// queues the patient's update or cancellation e-mail. On a test annex of its own.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt, type Annex } from '../helpers/booking-fixtures'
import { daysFromToday } from '../helpers/dates'
import type { RebookList } from '../../shared/types/rebook'

let admin: ApiClient
let annex: Annex
let day: string
let visitIds: number[]

beforeAll(async () => {
  admin = await signedInAs('admin@fernhollow.test')
  annex = await createAnnex({ rooms: 2, providers: 2, patients: 3 })
  // Patients with an address and consent, so their e-mails are queued (phone in the fictional 555-01xx range).
  for (const [index, id] of annex.patientIds.entries()) {
    await testDb()('patients').where({ id }).update({ email: `rebook-${annex.siteId}-${index}@fernhollow.test`, email_consent: true, phone: `555-01${20 + index}` })
  }
  day = daysFromToday(12, annex.timeZone)
  visitIds = []
  for (const [index, time] of ['09:00', '11:00', '13:00'].entries()) {
    const booked = await admin.post('/api/visits', {
      siteId: annex.siteId, operatoryId: annex.operatoryIds[index % 2], providerId: annex.providerIds[0], patientId: annex.patientIds[index],
      startUtc: utcAt(`${day}T${time}`, annex.timeZone), items: FILLING,
    })
    expect(booked.status, JSON.stringify(booked.body)).toBe(201)
    visitIds.push(booked.body.id)
  }
  const timeOff = await admin.post('/api/shift-exceptions', { providerId: annex.providerIds[0], kind: 'time_off', siteId: null, startDate: day, endDate: day })
  expect(timeOff.status).toBe(201)
  expect(timeOff.body.strandedVisits).toHaveLength(3)
})
afterAll(closeTestDb)

async function rebookList(): Promise<RebookList> {
  const response = await admin.get<RebookList>(`/api/rebook?siteId=${annex.siteId}`)
  expect(response.status).toBe(200)
  return response.body
}

describe('Rebook list', () => {
  it("lists the site's stranded visits with patient, phone, original time and reason", async () => {
    const list = await rebookList()
    expect(list.count).toBe(3)
    expect(list.visits.map((visit) => visit.id)).toEqual(visitIds)
    const [first] = list.visits
    expect(first).toMatchObject({ patient: `Annex0 Patient ${first!.patient.split(' ').slice(2).join(' ')}`, phone: '555-0120', siteId: annex.siteId, operatoryName: 'Room 1' })
    expect(first!.reason).toMatch(/ is away$/)
    expect(first!.startLocalIso).toMatch(new RegExp(`^${day}T09:00:00[-+]\\d\\d:\\d\\d$`))
    expect(first!.items).toEqual([{ templateCode: 'COMP-POST', notation: 'universal', tooth: '19', surfaces: 'MO' }])
  })

  it('shows the flag on the board as strandedReason', async () => {
    const board = await admin.get(`/api/visits?siteId=${annex.siteId}&fromUtc=${utcAt(`${day}T00:00`, annex.timeZone)}&toUtc=${utcAt(`${day}T23:00`, annex.timeZone)}`)
    expect(board.status).toBe(200)
    const reasons = board.body.map((visit: { strandedReason: string | null }) => visit.strandedReason)
    expect(reasons).toHaveLength(3)
    for (const reason of reasons) expect(reason).toMatch(/ is away$/)
  })

  it('moving a visit to another provider at a time that holds clears its flag and queues the update e-mail', async () => {
    const [entry] = (await rebookList()).visits
    const moved = await admin.patch(`/api/visits/${entry!.id}`, { rowVersion: entry!.rowVersion, providerId: annex.providerIds[1] })
    expect(moved.status, JSON.stringify(moved.body)).toBe(200)
    expect((await rebookList()).visits.map((visit) => visit.id)).toEqual(visitIds.slice(1))
    const row = await testDb()('visits').where({ id: entry!.id }).first('stranded_reason', 'stranded_at', 'provider_id')
    expect(row).toEqual({ stranded_reason: null, stranded_at: null, provider_id: annex.providerIds[1] })
    const mail = await testDb()('outbox').where({ visit_id: entry!.id, kind: 'update' }).first('id')
    expect(mail).toBeDefined()
    const audit = await testDb()('audit_log').where({ action: 'visit_unstranded', entity_id: String(entry!.id) }).first('after')
    expect(typeof audit.after === 'string' ? JSON.parse(audit.after) : audit.after).toEqual({ how: 'moved' })
  })

  it('a move that still does not hold is refused and the visit stays on the list', async () => {
    const entry = (await rebookList()).visits[0]!
    const refused = await admin.patch(`/api/visits/${entry.id}`, { rowVersion: entry.rowVersion, startUtc: utcAt(`${day}T15:00`, annex.timeZone) })
    expect(refused.status).toBe(409)
    expect((await rebookList()).visits.map((visit) => visit.id)).toContain(entry.id)
  })

  it('moving a visit to another site in scope clears its flag', async () => {
    const other = await createAnnex({ rooms: 1, providers: 1, patients: 0 })
    const entry = (await rebookList()).visits[0]!
    const moved = await admin.patch(`/api/visits/${entry.id}`, {
      rowVersion: entry.rowVersion, siteId: other.siteId, operatoryId: other.operatoryIds[0], providerId: other.providerIds[0],
      startUtc: utcAt(`${day}T10:00`, other.timeZone),
    })
    expect(moved.status, JSON.stringify(moved.body)).toBe(200)
    expect(moved.body.siteId).toBe(other.siteId)
    expect((await rebookList()).visits.map((visit) => visit.id)).not.toContain(entry.id)
    // Another site needs its chair and provider: 400 naming the field.
    const last = (await rebookList()).visits[0]!
    const vague = await admin.patch(`/api/visits/${last.id}`, { rowVersion: last.rowVersion, siteId: other.siteId })
    expect(vague.status).toBe(400)
    expect(vague.body.data.field).toBe('operatoryId')
  })

  it('cancelling a visit with a reason clears its flag and queues the cancellation e-mail', async () => {
    const entry = (await rebookList()).visits[0]!
    const cancelled = await admin.post(`/api/visits/${entry.id}/cancel`, { reason: 'Patient will call back', rowVersion: entry.rowVersion })
    expect(cancelled.status).toBe(200)
    expect((await rebookList()).count).toBe(0)
    expect(await testDb()('visits').where({ id: entry.id }).first('stranded_reason')).toEqual({ stranded_reason: null })
    expect(await testDb()('outbox').where({ visit_id: entry.id, kind: 'cancellation' }).first('id')).toBeDefined()
  })

  it('answers 400 without a site id, 401 signed out and 403 outside the caller\'s sites or role', async () => {
    expect((await admin.get('/api/rebook')).status).toBe(400)
    const bad = await admin.get('/api/rebook?siteId=abc')
    expect(bad.status).toBe(400)
    expect(bad.body.data.field).toBe('siteId')
    expect((await new ApiClient().get(`/api/rebook?siteId=${annex.siteId}`)).status).toBe(401)
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    expect((await desk.get(`/api/rebook?siteId=${annex.siteId}`)).status).toBe(403)
    expect((await desk.get(`/api/rebook?siteId=${await siteIdBySlug('quarry-street')}`)).status).toBe(200)
    const dentist = await signedInAs('dentist@fernhollow.test')
    expect((await dentist.get(`/api/rebook?siteId=${await siteIdBySlug('quarry-street')}`)).status).toBe(403)
  })
})
