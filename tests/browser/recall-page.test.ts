// Issue 17 §1 in the browser: the front desk sends a recall e-mail from the Recall screen; the patient
// opens the link from the message as it reached the mail catcher, sees up to six free times, picks one
// and it is booked. A time taken in between says so and shows fresh times. The patient page sets the
// patient's own recall interval (checked before saving), with the clinical caution beside it.
// Screenshots at 1440×900 and 1024×768, looked at. Private annex; dates computed from today.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { randomUUID } from 'node:crypto'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs, type ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, type Annex } from '../helpers/booking-fixtures'
import { createStaff, startIn, STAFF_PASSWORD } from '../helpers/midday'
import { mailsContaining, pollUntil } from '../helpers/mail'
import { runAxe, unlisted, type AllowedViolation } from '../helpers/axe'
import { signRecallToken } from '../../server/utils/recall-token'
import { addDays, todayIn } from '../../shared/utils/local-date'
import { readFileSync } from 'node:fs'
import { join } from 'node:path'

const ALLOWED = JSON.parse(readFileSync(join(process.cwd(), 'tests', 'browser', 'axe-allow-list.json'), 'utf8')) as AllowedViolation[]
const EXAM = [{ templateCode: 'EXAM-NEW' }]
let annex: Annex
let admin: ApiClient
let deskEmail: string
const patients: Array<{ id: number; name: string; email: string; recallId: number; dueDate: string }> = []

beforeAll(async () => {
  annex = await createAnnex({ rooms: 1, providers: 1, patients: 3, timeZone: 'America/Denver' })
  await testDb()('sites').where({ id: annex.siteId }).update({ email: `annex-${randomUUID().slice(0, 8)}@fernhollow.test`, phone: '555-0146', address: '21 Orchard Way', colour: '#0f766e' })
  admin = await signedInAs('admin@fernhollow.test')
  for (const [index, patientId] of annex.patientIds.slice(0, 2).entries()) {
    const email = `recall-page-${randomUUID().slice(0, 8)}@fernhollow.test`
    await testDb()('patients').where({ id: patientId }).update({ email, email_consent: true, preferred_site_id: annex.siteId })
    // Their last exam (finished): the page offers the same procedure.
    const last = await admin.post('/api/visits', { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId, items: EXAM, startUtc: startIn(60 * 24 * 80 + 120 * index) })
    expect(last.status, JSON.stringify(last.body)).toBe(201)
    await testDb()('visits').where({ id: last.body.id }).update({ state: 'finished' })
    const dueDate = addDays(todayIn(annex.timeZone), -5 - index)
    await testDb()('recalls').insert({ patient_id: patientId, kind: 'exam', due_date: dueDate }).onConflict(['patient_id', 'kind']).merge({ due_date: dueDate, booked_visit_id: null })
    const recall = await testDb()('recalls').where({ patient_id: patientId, kind: 'exam' }).first('id')
    const row = await testDb()('patients').where({ id: patientId }).first('first_name', 'last_name')
    patients.push({ id: patientId, name: `${row.first_name} ${row.last_name}`, email, recallId: recall.id, dueDate })
  }
  deskEmail = (await createStaff('front_desk', [annex.siteId])).email
})
afterAll(async () => { await closeTestDb() })

async function noAxeProblems(session: BrowserSession, path: string) {
  expect(unlisted(await runAxe(session.page), path, ALLOWED)).toEqual([])
}

describe('the recall e-mail\'s page', () => {
  it('recall e-mail → its link → pick a time → booked', async () => {
    const [patient] = patients
    const desk = await openBrowser(inject('baseURL'), { width: 1440, height: 900 })
    try {
      await signInThroughForm(desk.page, deskEmail, STAFF_PASSWORD)
      await desk.page.waitForURL(/\/chairboard/)
      await desk.page.goto('/recall')
      const row = desk.page.getByTestId('recall-row').filter({ hasText: patient!.name })
      await expect.poll(() => row.count()).toBe(1)
      await row.getByRole('checkbox').check()
      await desk.page.getByTestId('recall-send').click()
      await expect.poll(() => desk.page.getByTestId('recall-notice').textContent()).toContain('Recall e-mail sent to 1 patient')
      expect(await desk.page.getByRole('note').first().textContent()).toContain('local regulations and the treating clinician decide')
      await screenshot(desk.page, 'recall-page-sent-1440')
    } finally {
      await desk.close()
    }

    const mails = await pollUntil(() => mailsContaining(patient!.email), (found) => found.some((mail) => (mail.parsed.subject ?? '').includes('Time for your exam')))
    const mail = mails.find((found) => (found.parsed.subject ?? '').includes('Time for your exam'))!
    const link = /Choose a time: (\S+)/.exec(mail.parsed.text ?? '')?.[1]
    expect(link, mail.parsed.text).toMatch(/\/recall-times\//)

    const visitor = await openBrowser(inject('baseURL'), { width: 1440, height: 900 })
    try {
      await visitor.page.goto(link!)
      const times = visitor.page.getByTestId('recall-time')
      await times.first().waitFor()
      const count = await times.count()
      expect(count).toBeGreaterThan(0)
      expect(count).toBeLessThanOrEqual(6)
      expect(await visitor.page.getByTestId('recall-times-page').textContent()).toContain('New-patient exam')
      await screenshot(visitor.page, 'recall-page-times-1440')
      await noAxeProblems(visitor, '/recall-times/')
      await visitor.page.setViewportSize({ width: 1024, height: 768 })
      await screenshot(visitor.page, 'recall-page-times-1024')
      const chosen = (await times.first().textContent())!.trim()
      await times.first().click()
      await expect.poll(() => visitor.page.getByTestId('recall-times-booked').textContent()).toContain('Booked.')
      expect(await visitor.page.getByTestId('recall-times-booked').textContent()).toContain(chosen)
      await screenshot(visitor.page, 'recall-page-booked-1024')
    } finally {
      await visitor.close()
    }
    const recall = await testDb()('recalls').where({ id: patient!.recallId }).first('booked_visit_id')
    expect(recall.booked_visit_id).not.toBeNull()
    expect((await testDb()('visits').where({ id: recall.booked_visit_id }).first('patient_id')).patient_id).toBe(patient!.id)
  })

  it('a time taken meanwhile: the page says it has just gone and shows fresh times', async () => {
    const patient = patients[1]!
    const token = signRecallToken(process.env.NUXT_MAIL_LINK_SECRET!, { recallId: patient.recallId, siteId: annex.siteId, patientId: patient.id, dueDate: patient.dueDate }, Date.now() + 86_400_000)
    const visitor = await openBrowser(inject('baseURL'), { width: 1024, height: 768 })
    try {
      await visitor.page.goto(`/recall-times/${token}`)
      const times = visitor.page.getByTestId('recall-time')
      await times.first().waitFor()
      const page = await admin.get(`/api/recall-times/${token}`)
      const first = page.body.openings[0]
      const taken = await admin.post('/api/visits', { siteId: annex.siteId, operatoryId: first.operatoryId, providerId: first.providerId, patientId: annex.patientIds[2], items: EXAM, startUtc: first.startUtc })
      expect(taken.status, JSON.stringify(taken.body)).toBe(201)
      const before = (await times.first().textContent())!.trim()
      await times.first().click()
      await expect.poll(() => visitor.page.getByTestId('recall-times-problem').textContent()).toContain('that time has just gone')
      await expect.poll(async () => (await times.first().textContent())!.trim()).not.toBe(before)
      await screenshot(visitor.page, 'recall-page-just-gone-1024')
    } finally {
      await visitor.close()
    }
  })

  it('a bad link says so in words', async () => {
    const visitor = await openBrowser(inject('baseURL'), { width: 1024, height: 768 })
    try {
      await visitor.page.goto('/recall-times/12.3.4.not-a-signature')
      await expect.poll(() => visitor.page.getByTestId('recall-times-error').textContent()).toContain('This link is not valid')
    } finally {
      await visitor.close()
    }
  })
})

describe('the patient page\'s recall intervals', () => {
  it('checks the months before saving, saves them, and shows the caution', async () => {
    const session = await openBrowser(inject('baseURL'), { width: 1024, height: 768 })
    try {
      await signInThroughForm(session.page, deskEmail, STAFF_PASSWORD)
      await session.page.waitForURL(/\/chairboard/)
      await session.page.goto(`/patients/${patients[0]!.id}`)
      const section = session.page.getByTestId('recall-intervals')
      await expect.poll(() => section.getByTestId('recall-interval-exam').textContent()).toContain('every 12 months')
      expect(await section.getByRole('note').textContent()).toContain('local regulations and the treating clinician decide')
      await section.getByTestId('recall-intervals-edit').click()
      await section.getByTestId('recall-months-cleaning').fill('40')
      await section.getByTestId('recall-months-exam').fill('24')
      await section.getByTestId('recall-intervals-save').click()
      await expect.poll(() => section.textContent()).toContain('must be at most 36 months')
      await screenshot(session.page, 'recall-intervals-invalid-1024')
      await section.getByTestId('recall-months-cleaning').fill('3')
      await section.getByTestId('recall-intervals-save').click()
      await expect.poll(() => section.getByTestId('recall-interval-exam').textContent()).toContain('every 24 months')
      expect(await section.getByTestId('recall-interval-cleaning').textContent()).toContain('every 3 months')
      await session.page.setViewportSize({ width: 1440, height: 900 })
      await screenshot(session.page, 'recall-intervals-saved-1440')
    } finally {
      await session.close()
    }
    expect(await testDb()('patient_recall_intervals').where({ patient_id: patients[0]!.id }).orderBy('kind').select('kind', 'months')).toEqual([{ kind: 'cleaning', months: 3 }, { kind: 'exam', months: 24 }])
  })
})
