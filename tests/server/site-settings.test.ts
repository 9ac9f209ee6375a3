// A site's patient-mail and booking settings over HTTP: defaults, who may change them, every 400,
// and that bookings made afterwards follow them (notice, reminder hours).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { type ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'
import { bookingFor, createMailAnnex, outboxRowsOf, type MailAnnex } from '../helpers/mail-fixtures'
import { atAhead, TUESDAY } from '../helpers/dates'

/** JSON columns may come back parsed or as text, depending on the column type MariaDB reports. */
function json(value: unknown) {
  return typeof value === 'string' ? JSON.parse(value) : value
}

const GOOD = {
  minimumNoticeMinutes: 120,
  reminderOffsetsHours: [72, 24],
  quietHours: { start: '21:00', end: '07:30' },
  includeProcedureNames: false,
  patientCancel: 'request',
  whatToBring: 'your insurance card',
  alarmMinutes: 30,
}

let manager: ApiClient
let annex: MailAnnex

beforeAll(async () => {
  manager = await signedInAs('manager@fernhollow.test')
  // A mail lane no process serves: a stored key this form does not own, which must survive a save.
  annex = await createMailAnnex({ patients: 2, mailLane: `settings-${Date.now()}` })
})
afterAll(closeTestDb)

describe('site settings', () => {
  it('reads the group defaults for a site that never set any', async () => {
    // Closed (inactive), so it never becomes anyone's default site on the browser tests' screens.
    const [siteId] = await testDb()('sites').insert({ name: `Defaults annex ${Date.now()}`, slug: `defaults-${Date.now()}`, time_zone: 'America/Chicago', opening_hours: '{}', closed_dates: '[]', settings: '{}', active: false })
    const response = await manager.get(`/api/sites/${siteId}/settings`)
    expect(response.status).toBe(200)
    expect(response.body).toMatchObject({ minimumNoticeMinutes: 60, reminderOffsetsHours: [48, 3], quietHours: { start: '20:00', end: '08:00' }, includeProcedureNames: false, patientCancel: 'request', alarmMinutes: 60 })
  })

  it('keeps front desk out (403) and a manager of another site out (403)', async () => {
    const quarry = await siteIdBySlug('quarry-street')
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    expect((await desk.get(`/api/sites/${quarry}/settings`)).status).toBe(403)
    expect((await desk.put(`/api/sites/${quarry}/settings`, GOOD)).status).toBe(403)
  })

  it.each([
    ['a negative notice', { minimumNoticeMinutes: -5 }, 'minimumNoticeMinutes'],
    ['a notice beyond a week', { minimumNoticeMinutes: 20_000 }, 'minimumNoticeMinutes'],
    ['a reminder listed twice', { reminderOffsetsHours: [24, 24] }, 'reminderOffsetsHours'],
    ['a reminder of half an hour', { reminderOffsetsHours: [0.5] }, 'reminderOffsetsHours.0'],
    ['five reminders', { reminderOffsetsHours: [1, 2, 3, 4, 5] }, 'reminderOffsetsHours'],
    ['quiet hours that start and end together', { quietHours: { start: '20:00', end: '20:00' } }, 'quietHours.end'],
    ['a quiet time that is not one', { quietHours: { start: '8pm', end: '07:00' } }, 'quietHours.start'],
    ['an unknown cancel policy', { patientCancel: 'ignore' }, 'patientCancel'],
    ['nothing to bring', { whatToBring: '   ' }, 'whatToBring'],
    ['a two-minute alert', { alarmMinutes: 2 }, 'alarmMinutes'],
  ])('answers %s with 400 naming the field, and changes nothing', async (_case, change, field) => {
    const before = await manager.get(`/api/sites/${annex.siteId}/settings`)
    const response = await manager.put(`/api/sites/${annex.siteId}/settings`, { ...GOOD, ...change })
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe(field)
    expect((await manager.get(`/api/sites/${annex.siteId}/settings`)).body).toEqual(before.body)
  })

  it('saves, keeps other stored keys, and bookings afterwards follow the new notice and reminder hours', async () => {
    const stored = json((await testDb()('sites').where({ id: annex.siteId }).first('settings')).settings)
    const saved = await manager.put(`/api/sites/${annex.siteId}/settings`, GOOD)
    expect(saved.status).toBe(200)
    expect(saved.body).toMatchObject(GOOD)
    const after = json((await testDb()('sites').where({ id: annex.siteId }).first('settings')).settings)
    expect(after.mailLane).toBe(stored.mailLane)
    expect(await testDb()('audit_log').where({ action: 'site_settings_changed', entity_id: String(annex.siteId) })).toHaveLength(1)

    // 95–100 minutes from now, on the 5-minute grid: inside the new two-hour notice.
    const fiveMinutes = 5 * 60_000
    const soon = new Date(Math.floor((Date.now() + 100 * 60_000) / fiveMinutes) * fiveMinutes).toISOString()
    const early = await manager.post('/api/visits', bookingFor(annex, 0, soon))
    expect(early.status).toBe(400)
    expect(early.body.data).toMatchObject({ field: 'startUtc', reason: 'must be at least 120 minutes from now' })
    const later = await manager.post('/api/visits', bookingFor(annex, 1, atAhead(3, TUESDAY, '11:00', 'America/Los_Angeles')))
    expect(later.status).toBe(201)
    const reminders = (await outboxRowsOf(later.body.id)).filter((row) => row.kind === 'reminder')
    expect(reminders.map((row) => json(row.payload).offsetHours).sort((a: number, b: number) => b - a)).toEqual([72, 24])
  })
})
