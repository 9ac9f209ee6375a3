// Issue 17 §1: the recall e-mail's page. The link (signed like the visit and offer links) opens a page
// listing up to 6 times for the recall's plan at the patient's preferred site; the patient picks one
// and it is booked through the booking transaction (the recall marked booked, an audit row), or told
// that the time has just gone and shown fresh times. Bad or edited links are 404, expired ones 410.
// Private annex only; every date is computed from today.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { randomUUID } from 'node:crypto'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, type Annex } from '../helpers/booking-fixtures'
import { middayZone, startIn } from '../helpers/midday'
import { jsonOf, mailsContaining, pollUntil } from '../helpers/mail'
import { signRecallToken } from '../../server/utils/recall-token'
import { addDays, addMonths, localDateAt, todayIn } from '../../shared/utils/local-date'

let annex: Annex
let admin: ApiClient
const EXAM = [{ templateCode: 'EXAM-NEW' }]
const secret = () => process.env.NUXT_MAIL_LINK_SECRET!

interface Opening { startUtc: string; startLocalIso: string; operatoryId: number; providerId: number }
interface Page { state: 'open' | 'booked'; kind: string; dueDate: string; what: string; minutes: number; openings: Opening[]; bookedStartUtc: string | null; siteName: string }

beforeAll(async () => {
  // One chair and one provider: a time someone else books is really gone.
  annex = await createAnnex({ rooms: 1, providers: 1, patients: 6, timeZone: middayZone() })
  await testDb()('sites').where({ id: annex.siteId }).update({ email: `annex-${randomUUID().slice(0, 8)}@fernhollow.test`, phone: '555-0144', address: '3 Mill Lane' })
  admin = await signedInAs('admin@fernhollow.test')
})
afterAll(async () => { await closeTestDb() })

/** A patient with e-mail consent who had an exam, finished; their exam recall made due `daysFromToday`. */
async function patientDueForExam(index: number, daysFromToday = -7): Promise<{ patientId: number; recallId: number; email: string; dueDate: string }> {
  const patientId = annex.patientIds[index]!
  const email = `recall-page-${randomUUID().slice(0, 8)}@fernhollow.test`
  await testDb()('patients').where({ id: patientId }).update({ email, email_consent: true, preferred_site_id: annex.siteId })
  // Their last exam (the recall page offers the procedure they last had): booked well ahead, marked finished.
  const last = await admin.post('/api/visits', { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId, items: EXAM, startUtc: startIn(60 * 24 * 70 + 90 * index) })
  expect(last.status, JSON.stringify(last.body)).toBe(201)
  await testDb()('visits').where({ id: last.body.id }).update({ state: 'finished' })
  const dueDate = addDays(todayIn(annex.timeZone), daysFromToday)
  await testDb()('recalls').insert({ patient_id: patientId, kind: 'exam', due_date: dueDate }).onConflict(['patient_id', 'kind']).merge({ due_date: dueDate, booked_visit_id: null })
  const recall = await testDb()('recalls').where({ patient_id: patientId, kind: 'exam' }).first('id')
  return { patientId, recallId: recall.id, email, dueDate }
}

const tokenFor = (recall: { recallId: number; patientId: number; dueDate: string }, expiresAtMs = Date.now() + 7 * 86_400_000) =>
  signRecallToken(secret(), { recallId: recall.recallId, siteId: annex.siteId, patientId: recall.patientId, dueDate: recall.dueDate }, expiresAtMs)

describe('the recall page', () => {
  it('the recall e-mail links to a page listing at most 6 times for the plan at the preferred site, earliest first', async () => {
    const recall = await patientDueForExam(0)
    const sent = await admin.post('/api/recalls/mail', { siteId: annex.siteId, recallIds: [recall.recallId] })
    expect(sent.body.sent, JSON.stringify(sent.body)).toEqual([recall.recallId])
    const [mail] = await pollUntil(() => mailsContaining(recall.email), (mails) => mails.length > 0)
    const link = /https?:\/\/\S+\/recall-times\/([^\s"<>]+)/.exec(mail!.parsed.text ?? '')
    expect(link, mail!.parsed.text).not.toBeNull()
    expect(mail!.parsed.html).toContain('Choose a time')

    const page = await new ApiClient().get(`/api/recall-times/${link![1]}`)
    expect(page.status, JSON.stringify(page.body)).toBe(200)
    const body = page.body as Page
    expect(body).toMatchObject({ state: 'open', kind: 'exam', dueDate: recall.dueDate, what: 'New-patient exam' })
    expect(body.openings.length).toBeGreaterThan(0)
    expect(body.openings.length).toBeLessThanOrEqual(6)
    const starts = body.openings.map((opening) => Date.parse(opening.startUtc))
    expect(starts).toEqual([...starts].sort((a, b) => a - b))
    expect(starts[0]!).toBeGreaterThan(Date.now() - 60_000)
    for (const opening of body.openings) expect(annex.operatoryIds).toContain(opening.operatoryId)
  })

  it('picking a time books it through the booking transaction, marks the recall booked and writes an audit row', async () => {
    const recall = await patientDueForExam(1)
    const token = tokenFor(recall)
    const page = (await new ApiClient().get(`/api/recall-times/${token}`)).body as Page
    const chosen = page.openings[0]!
    const booked = await new ApiClient().post(`/api/recall-times/${token}/book`, chosen)
    expect(booked.status, JSON.stringify(booked.body)).toBe(201)
    expect(booked.body).toMatchObject({ state: 'booked', bookedStartUtc: new Date(chosen.startUtc).toISOString() })
    const row = await testDb()('recalls').where({ id: recall.recallId }).first('booked_visit_id')
    const visit = await testDb()('visits').where({ id: row.booked_visit_id }).first('patient_id', 'state', 'note', 'operatory_id', 'start_utc')
    expect(visit).toMatchObject({ patient_id: recall.patientId, state: 'booked', note: 'Booked by the patient from a recall e-mail', operatory_id: chosen.operatoryId })
    expect(visit.start_utc.toISOString()).toBe(new Date(chosen.startUtc).toISOString())
    const audit = await testDb()('audit_log').where({ entity: 'recall', entity_id: String(recall.recallId), action: 'recall_booked' }).first('user_id', 'after')
    expect(audit.user_id).toBeNull()
    expect(jsonOf(audit.after)).toMatchObject({ visitId: row.booked_visit_id, patientId: recall.patientId, kind: 'exam' })
    // The page now says it is booked; a second press books nothing more (409 naming the recall).
    expect(((await new ApiClient().get(`/api/recall-times/${token}`)).body as Page).state).toBe('booked')
    const again = await new ApiClient().post(`/api/recall-times/${token}/book`, page.openings[1] ?? chosen)
    expect(again.status).toBe(409)
    expect(again.body.data.field).toBe('recall')
    expect(await testDb()('visits').where({ patient_id: recall.patientId, state: 'booked' }).count({ n: '*' }).first()).toMatchObject({ n: 1 })
    // Booked: no longer on the Recall list.
    const list = await admin.get(`/api/recalls?siteId=${annex.siteId}&to=${addDays(todayIn(annex.timeZone), 30)}`)
    expect(list.body.map((entry: { id: number }) => entry.id)).not.toContain(recall.recallId)
  })

  it('a time taken in between: 409 "just gone" with fresh times that leave it out', async () => {
    const recall = await patientDueForExam(2)
    const token = tokenFor(recall)
    const page = (await new ApiClient().get(`/api/recall-times/${token}`)).body as Page
    const chosen = page.openings[0]!
    // The front desk books that very time for someone else first.
    const other = await admin.post('/api/visits', { siteId: annex.siteId, operatoryId: chosen.operatoryId, providerId: chosen.providerId, patientId: annex.patientIds[5], items: EXAM, startUtc: chosen.startUtc })
    expect(other.status, JSON.stringify(other.body)).toBe(201)
    const late = await new ApiClient().post(`/api/recall-times/${token}/book`, chosen)
    expect(late.status).toBe(409)
    expect(late.body.message).toContain('that time has just gone')
    const fresh = late.body.data.openings as Opening[]
    expect(fresh.length).toBeGreaterThan(0)
    expect(fresh.length).toBeLessThanOrEqual(6)
    expect(fresh.map((opening) => opening.startUtc)).not.toContain(chosen.startUtc)
    expect((await testDb()('recalls').where({ id: recall.recallId }).first('booked_visit_id')).booked_visit_id).toBeNull()
    // One of the fresh times books.
    const second = await new ApiClient().post(`/api/recall-times/${token}/book`, fresh[0])
    expect(second.status, JSON.stringify(second.body)).toBe(201)
  })

  it('bad, edited, stale or expired links are a clear 4xx; a bad choice is a 400 naming the field', async () => {
    const recall = await patientDueForExam(3)
    const token = tokenFor(recall)
    const anonymous = new ApiClient()
    expect((await anonymous.get('/api/recall-times/not-a-token')).status).toBe(404)
    const edited = token.replace(/^\d+\./, `${recall.recallId + 1000000}.`)
    expect((await anonymous.get(`/api/recall-times/${edited}`)).status).toBe(404)
    const otherSite = token.replace(/^(\d+)\.(\d+)\./, (_, id) => `${id}.${annex.siteId + 1}.`)
    expect((await anonymous.get(`/api/recall-times/${otherSite}`)).status).toBe(404)
    const tampered = `${token.slice(0, -1)}${token.endsWith('A') ? 'B' : 'A'}`
    const answer = await anonymous.get(`/api/recall-times/${tampered}`)
    expect(answer.status).toBe(404)
    expect(answer.body.message).toBe('This link is not valid. Please call the practice.')
    const expired = await anonymous.get(`/api/recall-times/${tokenFor(recall, Date.now() - 60_000)}`)
    expect(expired.status).toBe(410)
    expect(expired.body.message).toContain('expired')
    // A link for an older due date stops matching once a finished visit set a new one.
    const stale = tokenFor({ ...recall, dueDate: addDays(recall.dueDate, -180) })
    expect((await anonymous.get(`/api/recall-times/${stale}`)).status).toBe(404)
    expect((await anonymous.post(`/api/recall-times/${tokenFor(recall, Date.now() - 60_000)}/book`, { startUtc: startIn(60), operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0] })).status).toBe(410)

    const noTime = await anonymous.post(`/api/recall-times/${token}/book`, { operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0] })
    expect(noTime.status).toBe(400)
    expect(noTime.body.data.field).toBe('startUtc')
    const badChair = await anonymous.post(`/api/recall-times/${token}/book`, { startUtc: startIn(60), operatoryId: 'one', providerId: annex.providerIds[0] })
    expect(badChair.status).toBe(400)
    expect(badChair.body.data.field).toBe('operatoryId')
  })
})

describe('a patient\'s own recall interval', () => {
  it('is set and cleared per kind, checked field by field, and the next finished visit uses it', async () => {
    // An annex of its own: the exam below is finished today, so it needs a free chair within the hour.
    const own = await createAnnex({ rooms: 1, providers: 1, patients: 1, timeZone: middayZone() })
    const patientId = own.patientIds[0]!
    expect((await new ApiClient().get(`/api/patients/${patientId}/recall-intervals`)).status).toBe(401)
    const start = await admin.get(`/api/patients/${patientId}/recall-intervals`)
    expect(start.status).toBe(200)
    // 6 and 12 months: the group defaults (common practice, no source).
    expect(start.body).toEqual([
      { kind: 'cleaning', months: null, siteMonths: 6, effectiveMonths: 6 },
      { kind: 'exam', months: null, siteMonths: 12, effectiveMonths: 12 },
    ])
    for (const [body, field] of [[{ cleaning: 0, exam: null }, 'cleaning'], [{ cleaning: null, exam: 37 }, 'exam'], [{ cleaning: 2.5, exam: null }, 'cleaning'], [{ cleaning: 'three', exam: null }, 'cleaning'], [{ cleaning: null }, 'exam']] as const) {
      const refused = await admin.put(`/api/patients/${patientId}/recall-intervals`, body)
      expect(refused.status, JSON.stringify(body)).toBe(400)
      expect(refused.body.data.field).toBe(field)
    }
    expect((await admin.put(`/api/patients/${patientId}/recall-intervals`, { cleaning: 3, exam: 24, filling: 6 })).status).toBe(400)
    expect((await admin.put('/api/patients/99999999/recall-intervals', { cleaning: 3, exam: 24 })).status).toBe(404)

    const saved = await admin.put(`/api/patients/${patientId}/recall-intervals`, { cleaning: 3, exam: 24 })
    expect(saved.status, JSON.stringify(saved.body)).toBe(200)
    expect(saved.body).toEqual([
      { kind: 'cleaning', months: 3, siteMonths: 6, effectiveMonths: 3 },
      { kind: 'exam', months: 24, siteMonths: 12, effectiveMonths: 24 },
    ])
    const audit = await testDb()('audit_log').where({ entity: 'patient', entity_id: String(patientId), action: 'recall_interval_changed' }).first('after')
    expect(jsonOf(audit.after)).toEqual({ cleaning: 3, exam: 24 })

    // Finishing an exam now sets the due date 24 months on, not the site's 12.
    const visit = await admin.post('/api/visits', { siteId: own.siteId, operatoryId: own.operatoryIds[0], providerId: own.providerIds[0], patientId, items: EXAM, startUtc: startIn(20) })
    expect(visit.status, JSON.stringify(visit.body)).toBe(201)
    for (const state of ['arrived', 'treating', 'finished']) {
      const moved = await admin.post(`/api/visits/${visit.body.id}/state`, { state })
      expect(moved.status, JSON.stringify(moved.body)).toBe(200)
    }
    const visitDate = localDateAt(Date.parse(visit.body.startUtc), own.timeZone)
    expect((await testDb()('recalls').where({ patient_id: patientId, kind: 'exam' }).first('due_date')).due_date).toBe(addMonths(visitDate, 24))

    const cleared = await admin.put(`/api/patients/${patientId}/recall-intervals`, { cleaning: null, exam: null })
    expect(cleared.body.map((interval: { effectiveMonths: number }) => interval.effectiveMonths)).toEqual([6, 12])
  })
})
