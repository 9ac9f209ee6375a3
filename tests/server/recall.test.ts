// Issue 17 §1: recall. Finishing a visit whose template is an exam (or a cleaning) sets the patient's
// next due date from the visit's local date plus the site's interval (12 months for an exam by default:
// common practice, no source); booking a later visit of that kind marks the recall booked; the Recall
// list and its e-mail (previewed, never again within the site's minimum interval). Private annex only.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { randomUUID } from 'node:crypto'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, type Annex } from '../helpers/booking-fixtures'
import { middayZone, startIn } from '../helpers/midday'
import { mailsContaining, pollUntil } from '../helpers/mail'
import { addMonths, addDays, localDateAt, todayIn } from '../../shared/utils/local-date'

let annex: Annex
let admin: ApiClient
const EXAM = [{ templateCode: 'EXAM-NEW' }]

beforeAll(async () => {
  annex = await createAnnex({ rooms: 2, providers: 1, patients: 4, timeZone: middayZone() })
  await testDb()('sites').where({ id: annex.siteId }).update({ email: `annex-${randomUUID().slice(0, 8)}@fernhollow.test`, phone: '555-0143', address: '12 Quarry Road' })
  admin = await signedInAs('admin@fernhollow.test')
})
afterAll(async () => { await closeTestDb() })

async function book(patientIndex: number, startUtc: string) {
  const response = await admin.post('/api/visits', { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[patientIndex], items: EXAM, startUtc })
  expect(response.status, JSON.stringify(response.body)).toBe(201)
  return response.body as { id: number; startUtc: string }
}

describe('recall due dates', () => {
  it('finishing an exam sets the next exam due date; booking a later exam marks it booked', async () => {
    const visit = await book(0, startIn(20))
    for (const state of ['arrived', 'treating', 'finished']) {
      const moved = await admin.post(`/api/visits/${visit.id}/state`, { state })
      expect(moved.status, JSON.stringify(moved.body)).toBe(200)
    }
    const recall = await testDb()('recalls').where({ patient_id: annex.patientIds[0], kind: 'exam' }).first()
    expect(recall.due_date).toBe(addMonths(localDateAt(Date.parse(visit.startUtc), annex.timeZone), 12))
    expect(recall.booked_visit_id).toBeNull()
    expect(await testDb()('recalls').where({ patient_id: annex.patientIds[0], kind: 'cleaning' }).first()).toBeUndefined()

    const next = await book(0, startIn(60 * 24 * 40))
    expect((await testDb()('recalls').where({ id: recall.id }).first()).booked_visit_id).toBe(next.id)
    // Booked: no longer on the Recall list even in a window reaching its due date.
    const list = await admin.get(`/api/recalls?siteId=${annex.siteId}&to=${addDays(todayIn(annex.timeZone), 400)}`)
    expect(list.status).toBe(200)
    expect(list.body.map((entry: { id: number }) => entry.id)).not.toContain(recall.id)
  })

  it('lists due patients, previews and sends the recall e-mail, and not again within the interval', async () => {
    const patientId = annex.patientIds[1]!
    const email = `recall-${randomUUID().slice(0, 8)}@fernhollow.test`
    await testDb()('patients').where({ id: patientId }).update({ email, email_consent: true, preferred_site_id: annex.siteId })
    const today = todayIn(annex.timeZone)
    const [id] = await testDb()('recalls').insert({ patient_id: patientId, kind: 'cleaning', due_date: addDays(today, -10) })
    expect((await new ApiClient().get(`/api/recalls?siteId=${annex.siteId}`)).status).toBe(401)
    const list = await admin.get(`/api/recalls?siteId=${annex.siteId}`)
    expect(list.status).toBe(200)
    expect(list.body.find((entry: { id: number }) => entry.id === id)).toMatchObject({ patientId, kind: 'cleaning', dueDate: addDays(today, -10), emailConsent: true, lastContactUtc: null })
    expect((await admin.get(`/api/recalls?siteId=${annex.siteId}&kind=filling`)).status).toBe(400)

    const preview = await admin.post('/api/recalls/mail', { siteId: annex.siteId, recallIds: [id], preview: true })
    expect(preview.status, JSON.stringify(preview.body)).toBe(200)
    expect(preview.body.preview).toMatchObject({ to: email, subject: expect.stringContaining('Time for your cleaning') })
    expect(preview.body.sent).toEqual([])
    const sent = await admin.post('/api/recalls/mail', { siteId: annex.siteId, recallIds: [id] })
    expect(sent.body.sent).toEqual([id])
    const arrived = await pollUntil(() => mailsContaining(email), (mails) => mails.length > 0)
    expect(arrived[0]!.parsed.subject).toContain('Time for your cleaning')
    expect(await testDb()('audit_log').where({ entity: 'recall', entity_id: String(id), action: 'recall_mailed' }).count({ n: '*' }).first()).toMatchObject({ n: 1 })
    const again = await admin.post('/api/recalls/mail', { siteId: annex.siteId, recallIds: [id] })
    expect(again.body.sent).toEqual([])
    expect(again.body.skipped).toEqual([{ recallId: id, reason: 'contacted less than 14 days ago' }])
  })
})
