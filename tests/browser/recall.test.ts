// Issue 17 §1 on screen: the Recall screen lists a patient overdue for a cleaning; a preview of the
// recall e-mail shows what they would get; Book opens the Chairboard's drawer with the patient and a
// cleaning chosen. Private annex; the due date is computed from today.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { randomUUID } from 'node:crypto'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, type Annex } from '../helpers/booking-fixtures'
import { createStaff, STAFF_PASSWORD } from '../helpers/midday'
import { addDays, todayIn } from '../../shared/utils/local-date'

let browser: BrowserSession
let annex: Annex
let deskEmail: string
let patientName = ''

beforeAll(async () => {
  annex = await createAnnex({ rooms: 1, providers: 1, patients: 1, timeZone: 'America/Denver' })
  await testDb()('sites').where({ id: annex.siteId }).update({ email: `annex-${randomUUID().slice(0, 8)}@fernhollow.test`, phone: '555-0145', address: '8 Ridge Road' })
  const patientId = annex.patientIds[0]!
  await testDb()('patients').where({ id: patientId }).update({ email: `recall-${randomUUID().slice(0, 8)}@fernhollow.test`, email_consent: true, preferred_site_id: annex.siteId })
  await testDb()('recalls').insert({ patient_id: patientId, kind: 'cleaning', due_date: addDays(todayIn(annex.timeZone), -5) })
  const patient = await testDb()('patients').where({ id: patientId }).first('first_name', 'last_name')
  patientName = `${patient.first_name} ${patient.last_name}`
  deskEmail = (await createStaff('front_desk', [annex.siteId])).email
  browser = await openBrowser(inject('baseURL'), { width: 1300, height: 900 })
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('Recall screen', () => {
  it('lists the overdue patient, previews the e-mail and books them', async () => {
    const { page } = browser
    await signInThroughForm(page, deskEmail, STAFF_PASSWORD)
    await page.waitForURL(/\/chairboard/)
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Recall' }).click()
    const row = page.getByTestId('recall-row').filter({ hasText: patientName })
    await expect.poll(() => row.count()).toBe(1)
    expect(await row.textContent()).toContain('Overdue')
    await row.getByRole('checkbox').check()
    await page.getByTestId('recall-preview').click()
    await expect.poll(() => page.getByTestId('recall-preview-text').textContent()).toContain('Time for your cleaning')
    await screenshot(page, 'recall-screen-preview')
    await row.getByTestId('recall-book').click()
    await page.waitForURL(/\/chairboard/)
    const drawer = page.getByTestId('booking-drawer')
    await drawer.waitFor()
    await expect.poll(() => drawer.textContent()).toContain(patientName)
    await screenshot(page, 'recall-book-drawer')
  })
})
