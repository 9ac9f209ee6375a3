// Impact before saving (issue 13 §1): every kind of change that can strand booked visits answers
// them to `dryRun` and writes nothing; saving flags them (with audit rows) in the same transaction;
// a booking racing a change is either refused or flagged. Each test books on a test annex of its own.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { randomUUID } from 'node:crypto'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt, type Annex } from '../helpers/booking-fixtures'
import { daysFromToday } from '../helpers/dates'
import type { StrandedVisitDto } from '../../shared/types/rebook'

let admin: ApiClient

beforeAll(async () => {
  admin = await signedInAs('admin@fernhollow.test')
})
afterAll(closeTestDb)

interface Booked {
  annex: Annex
  day: string
  /** [provider 0 in room 0 at 09:00, provider 0 in room 1 at 11:00, provider 1 in room 1 at 14:00] */
  visitIds: number[]
}

async function book(annex: Annex, day: string, time: string, room: number, provider: number, patient: number, items: unknown = FILLING): Promise<number> {
  const response = await admin.post('/api/visits', {
    siteId: annex.siteId, operatoryId: annex.operatoryIds[room], providerId: annex.providerIds[provider], patientId: annex.patientIds[patient],
    startUtc: utcAt(`${day}T${time}`, annex.timeZone), items,
  })
  expect(response.status, JSON.stringify(response.body)).toBe(201)
  return response.body.id
}

async function bookedAnnex(): Promise<Booked> {
  const annex = await createAnnex({ rooms: 2, providers: 2, patients: 4 })
  const day = daysFromToday(9, annex.timeZone)
  const visitIds = [
    await book(annex, day, '09:00', 0, 0, 0),
    await book(annex, day, '11:00', 1, 0, 1),
    await book(annex, day, '14:00', 1, 1, 2),
  ]
  return { annex, day, visitIds }
}

async function flags(visitIds: number[]): Promise<Array<string | null>> {
  const rows = await testDb()('visits').whereIn('id', visitIds).orderBy('id').select('stranded_reason')
  return rows.map((row: { stranded_reason: string | null }) => row.stranded_reason)
}

const idsOf = (visits: StrandedVisitDto[]) => visits.map((visit) => visit.id)

/** A dry run answers exactly `expected`, each with a reason and its site-local start, and flags none. */
async function expectDryRun(response: { status: number; body: { strandedVisits: StrandedVisitDto[] } }, booked: Booked, expected: number[], reason: RegExp) {
  expect(response.status, JSON.stringify(response.body)).toBe(200)
  expect(Object.keys(response.body)).toEqual(['strandedVisits'])
  expect(idsOf(response.body.strandedVisits)).toEqual(expected)
  for (const visit of response.body.strandedVisits) {
    expect(visit.reason).toMatch(reason)
    expect(visit.siteId).toBe(booked.annex.siteId)
    expect(visit.patient).toMatch(/^Annex\d Patient /)
    // ISO 8601 with the site's offset (naming table: …LocalIso).
    expect(visit.startLocalIso).toMatch(new RegExp(`^${booked.day}T\\d\\d:\\d\\d:00[-+]\\d\\d:\\d\\d$`))
  }
  expect(await flags(booked.visitIds)).toEqual([null, null, null])
}

describe('impact before saving: dry runs answer the visits a change strands and write nothing', () => {
  it('time off for a provider', async () => {
    const booked = await bookedAnnex()
    const body = { providerId: booked.annex.providerIds[0], kind: 'time_off', siteId: booked.annex.siteId, startDate: booked.day, endDate: booked.day, reason: 'Flu' }
    const count = async () => Number((await testDb()('shift_exceptions').where({ provider_id: body.providerId }).count({ n: '*' }).first())?.n)
    const dry = await admin.post('/api/shift-exceptions', { ...body, dryRun: true })
    await expectDryRun(dry, booked, booked.visitIds.slice(0, 2), /^Dr\. Annex .* is away$/)
    expect(await count()).toBe(0)

    const saved = await admin.post('/api/shift-exceptions', body)
    expect(saved.status).toBe(201)
    expect(idsOf(saved.body.strandedVisits)).toEqual(booked.visitIds.slice(0, 2))
    expect(await count()).toBe(1)
    const reasons = await flags(booked.visitIds)
    expect(reasons[0]).toMatch(/is away$/)
    expect(reasons[1]).toMatch(/is away$/)
    expect(reasons[2]).toBeNull()
    // The time-off reason may be medical: never copied into the visit's reason.
    expect(reasons.join(' ')).not.toContain('Flu')
    const audit = await testDb()('audit_log').where({ action: 'visit_stranded', entity: 'visit' }).whereIn('entity_id', booked.visitIds.map(String))
    expect(audit).toHaveLength(2)

    // Withdrawing the time off makes them hold again: they leave the Rebook list.
    expect((await admin.delete(`/api/shift-exceptions/${saved.body.id}`)).status).toBe(200)
    expect(await flags(booked.visitIds)).toEqual([null, null, null])
  })

  it('a block on one chair, with its reason', async () => {
    const booked = await bookedAnnex()
    const body = { siteId: booked.annex.siteId, operatoryId: booked.annex.operatoryIds[1], startDate: booked.day, localStart: '10:30', localEnd: '12:00', reason: 'Handpiece repair' }
    const dry = await admin.post('/api/blocks', { ...body, dryRun: true })
    await expectDryRun(dry, booked, [booked.visitIds[1]!], /^Room 2 is blocked: Handpiece repair$/)
    expect(Number((await testDb()('blocks').where({ site_id: booked.annex.siteId }).count({ n: '*' }).first())?.n)).toBe(0)
    const saved = await admin.post('/api/blocks', body)
    expect(saved.status).toBe(201)
    expect(idsOf(saved.body.strandedVisits)).toEqual([booked.visitIds[1]])
    expect((await flags(booked.visitIds))[1]).toBe('Room 2 is blocked: Handpiece repair')
    // Removing it only frees time: its dry run strands nothing and keeps it; the real removal puts the visit back.
    const keep = await admin.delete(`/api/blocks/${saved.body.id}?dryRun=true`)
    expect(keep.body).toEqual({ strandedVisits: [] })
    expect(await testDb()('blocks').where({ id: saved.body.id }).first('id')).toBeDefined()
    expect((await admin.delete(`/api/blocks/${saved.body.id}`)).status).toBe(200)
    expect(await flags(booked.visitIds)).toEqual([null, null, null])
  })

  it('a shift edited or deleted', async () => {
    const booked = await bookedAnnex()
    const shift = await testDb()('shifts').where({ provider_id: booked.annex.providerIds[1] }).first('id')
    const edit = await admin.patch(`/api/shifts/${shift.id}`, { localStart: '00:00', localEnd: '12:00', dryRun: true })
    await expectDryRun(edit, booked, [booked.visitIds[2]!], /is not on shift then$/)
    const remove = await admin.delete(`/api/shifts/${shift.id}?dryRun=true`)
    await expectDryRun(remove, booked, [booked.visitIds[2]!], /is not on shift then$/)
    expect(await testDb()('shifts').where({ id: shift.id }).first('local_end')).toEqual({ local_end: '24:00' })

    // A new shift only adds time: its dry run answers nothing stranded and writes no row.
    const before = Number((await testDb()('shifts').count({ n: '*' }).first())?.n)
    const added = await admin.post('/api/shifts', { providerId: booked.annex.providerIds[1], siteId: booked.annex.siteId, rrule: 'FREQ=WEEKLY;BYDAY=SA', validFrom: booked.day, localStart: '08:00', localEnd: '12:00', dryRun: true })
    expect(added.status, JSON.stringify(added.body)).toBe(200)
    expect(added.body).toEqual({ strandedVisits: [] })
    expect(Number((await testDb()('shifts').count({ n: '*' }).first())?.n)).toBe(before)

    const deleted = await admin.delete(`/api/shifts/${shift.id}`)
    expect(deleted.status).toBe(200)
    expect(deleted.body).toEqual({ ok: true, strandedVisits: [expect.objectContaining({ id: booked.visitIds[2] })] })
    expect((await flags(booked.visitIds))[2]).toMatch(/is not on shift then$/)
  })

  it('an extra day withdrawn', async () => {
    const annex = await createAnnex({ rooms: 1, providers: 1, patients: 1 })
    const day = daysFromToday(9, annex.timeZone)
    // The provider's only hours that day are an extra shift.
    await testDb()('shifts').where({ provider_id: annex.providerIds[0] }).delete()
    const extra = await admin.post('/api/shift-exceptions', { providerId: annex.providerIds[0], kind: 'extra', siteId: annex.siteId, startDate: day, endDate: day, localStart: '08:00', localEnd: '12:00' })
    expect(extra.status).toBe(201)
    const visitId = await book(annex, day, '09:00', 0, 0, 0)
    const dry = await admin.delete(`/api/shift-exceptions/${extra.body.id}?dryRun=true`)
    expect(dry.status).toBe(200)
    expect(idsOf(dry.body.strandedVisits)).toEqual([visitId])
    expect(await testDb()('shift_exceptions').where({ id: extra.body.id }).first('id')).toBeDefined()
  })

  it("a site's opening hours or closed dates", async () => {
    const booked = await bookedAnnex()
    const weekday = String(new Date(`${booked.day}T12:00:00Z`).getUTCDay() || 7)
    const allDay = [{ start: '00:00', end: '24:00' }]
    const hours = Object.fromEntries(['1', '2', '3', '4', '5', '6', '7'].map((key) => [key, key === weekday ? [{ start: '08:00', end: '13:30' }] : allDay]))
    const shorter = await admin.patch(`/api/sites/${booked.annex.siteId}`, { openingHours: hours, dryRun: true })
    await expectDryRun(shorter, booked, [booked.visitIds[2]!], /^Outside the site's opening hours$/)
    const closed = await admin.patch(`/api/sites/${booked.annex.siteId}`, { closedDates: [booked.day], dryRun: true })
    await expectDryRun(closed, booked, booked.visitIds, new RegExp(`^The site is closed on ${booked.day}$`))
    const { closed_dates: closedDates } = await testDb()('sites').where({ id: booked.annex.siteId }).first('closed_dates')
    expect(typeof closedDates === 'string' ? JSON.parse(closedDates) : closedDates).toEqual([])
  })

  it('a room taken out of use or losing a capability', async () => {
    const booked = await bookedAnnex()
    const room = booked.annex.operatoryIds[1]
    const off = await admin.patch(`/api/operatories/${room}`, { active: false, dryRun: true })
    await expectDryRun(off, booked, booked.visitIds.slice(1), /^Room 2 is out of use$/)
    const bare = await admin.patch(`/api/operatories/${room}`, { capabilities: ['hygiene'], dryRun: true })
    await expectDryRun(bare, booked, booked.visitIds.slice(1), /^Room 2 is not equipped for restorative/)
    expect(await testDb()('operatories').where({ id: room }).first('active')).toEqual({ active: 1 })
  })

  it('a provider deactivated, losing a category, or their account deactivated', async () => {
    const booked = await bookedAnnex()
    const providerId = booked.annex.providerIds[0]!
    const off = await admin.patch(`/api/providers/${providerId}`, { active: false, dryRun: true })
    await expectDryRun(off, booked, booked.visitIds.slice(0, 2), /no longer sees patients$/)
    const unskilled = await admin.patch(`/api/providers/${providerId}`, { capabilities: ['exam'], dryRun: true })
    await expectDryRun(unskilled, booked, booked.visitIds.slice(0, 2), /does not do restorative procedures/)
    const { user_id: userId } = await testDb()('providers').where({ id: providerId }).first('user_id')
    const account = await admin.patch(`/api/users/${userId}`, { active: false, dryRun: true })
    await expectDryRun(account, booked, booked.visitIds.slice(0, 2), /no longer sees patients$/)
    expect(await testDb()('users').where({ id: userId }).first('active')).toEqual({ active: 1 })

    const saved = await admin.patch(`/api/users/${userId}`, { active: false })
    expect(saved.status).toBe(200)
    expect(idsOf(saved.body.strandedVisits)).toEqual(booked.visitIds.slice(0, 2))
    // A deactivated account's provider cannot be booked any more (the same rule, in the booking transaction).
    const refused = await admin.post('/api/visits', {
      siteId: booked.annex.siteId, operatoryId: booked.annex.operatoryIds[0], providerId, patientId: booked.annex.patientIds[3],
      startUtc: utcAt(`${booked.day}T16:00`, booked.annex.timeZone), items: FILLING,
    })
    expect(refused.status).toBe(400)
    expect(refused.body.data.field).toBe('providerId')
  })

  it('a template whose room capability changes', async () => {
    const booked = await bookedAnnex()
    // Room 2 is not equipped for imaging; the test's own template is booked in both rooms.
    await testDb()('operatories').where({ id: booked.annex.operatoryIds[1] }).update({ capabilities: '["restorative","hygiene"]' })
    const code = `IMP${randomUUID().slice(0, 6).toUpperCase()}`
    const template = {
      code, name: `Impact ${code}`, category: 'restorative', capability: 'restorative', needsTooth: true, needsSurfaces: true, region: 'posterior',
      steps: [
        { label: 'Seat', kind: 'assist', role: 'seat', baseMinutes: 5, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
        { label: 'Restore', kind: 'hands_on', role: 'treat', baseMinutes: 20, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
        { label: 'Reset room', kind: 'reset', role: 'turnover', baseMinutes: 10, perExtraSurfaceMinutes: 0, perExtraToothMinutes: 0 },
      ],
      anaesthesia: {
        required: false,
        maxillary: { technique: 'infiltration', infiltration: { injectMinutes: 2, onsetMinutes: 3 }, block: { injectMinutes: 2, onsetMinutes: 10 } },
        mandibular: { technique: 'block', infiltration: { injectMinutes: 2, onsetMinutes: 3 }, block: { injectMinutes: 2, onsetMinutes: 10 } },
      },
    }
    const created = await admin.post('/api/templates', template)
    expect(created.status, JSON.stringify(created.body)).toBe(201)
    const items = [{ templateCode: code, tooth: '19', surfaces: 'O' }]
    const inRoom1 = await book(booked.annex, booked.day, '16:00', 0, 1, 3, items)
    const inRoom2 = await book(booked.annex, booked.day, '17:00', 1, 1, 3, items)
    const dry = await admin.put(`/api/templates/${created.body.id}`, { ...template, capability: 'imaging', dryRun: true })
    expect(dry.status, JSON.stringify(dry.body)).toBe(200)
    expect(idsOf(dry.body.strandedVisits)).toEqual([inRoom2])
    expect(dry.body.strandedVisits[0].reason).toBe(`Room 2 is not equipped for imaging (Impact ${code})`)
    expect(await flags([inRoom1, inRoom2])).toEqual([null, null])
    const versions = await testDb()('procedure_templates').where({ code }).count({ n: '*' }).first()
    expect(Number(versions?.n)).toBe(1)
  })
})

describe('a booking racing a change', () => {
  it('is either refused or flagged, never left silently inside the new block', async () => {
    const annex = await createAnnex({ rooms: 1, providers: 1, patients: 6 })
    const other = await signedInAs('manager@fernhollow.test')
    for (let round = 0; round < 6; round += 1) {
      const day = daysFromToday(10 + round, annex.timeZone)
      const [booking, block] = await Promise.all([
        admin.post('/api/visits', { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[round], startUtc: utcAt(`${day}T10:00`, annex.timeZone), items: FILLING }),
        other.post('/api/blocks', { siteId: annex.siteId, operatoryId: null, startDate: day, localStart: '09:00', localEnd: '13:00', reason: `Staff training ${round}` }),
      ])
      expect(block.status, JSON.stringify(block.body)).toBe(201)
      if (booking.status === 201) {
        // Committed first: the block's own check saw it and flagged it.
        expect(idsOf(block.body.strandedVisits)).toEqual([booking.body.id])
        expect(await flags([booking.body.id])).toEqual([`The site is blocked: Staff training ${round}`])
      } else {
        // Came second: its own checks saw the block (409 naming the room).
        expect(booking.status, JSON.stringify(booking.body)).toBe(409)
        expect(block.body.strandedVisits).toEqual([])
      }
    }
  })
})

describe('dryRun and the change routes: 400, 401, 403', () => {
  it('refuses a dryRun that is not true or false, signed-out callers and the wrong roles', async () => {
    const annex = await createAnnex({ rooms: 1, providers: 1, patients: 1 })
    const day = daysFromToday(9, annex.timeZone)
    const body = { siteId: annex.siteId, startDate: day, localStart: '09:00', localEnd: '10:00', reason: 'Meeting' }
    const bad = await admin.post('/api/blocks', { ...body, dryRun: 'yes' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.field).toBe('dryRun')
    const shift = await testDb()('shifts').where({ provider_id: annex.providerIds[0] }).first('id')
    expect((await admin.delete(`/api/shifts/${shift.id}?dryRun=maybe`)).status).toBe(400)
    expect((await new ApiClient().post('/api/blocks', { ...body, dryRun: true })).status).toBe(401)
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    expect((await desk.post('/api/blocks', { ...body, dryRun: true })).status).toBe(403)
    expect((await desk.delete(`/api/shifts/${shift.id}?dryRun=true`)).status).toBe(403)
    // A manager scoped to other sites (none here) is refused by site; the preview leaves nothing behind.
    expect(await testDb()('blocks').where({ site_id: annex.siteId }).first('id')).toBeUndefined()
  })
})
