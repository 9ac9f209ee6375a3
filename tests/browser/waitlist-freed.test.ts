// Issue 17 §2 on screen: new provider time reaches the waitlist. A manager adds an extra shift on the
// Rota screen for a site where nobody works that day; the saved shift's window is asked of the waitlist
// and the screen says how many waiting patients fit it, with their names on "Show who fits".
// Screenshots at 1440×900 and 1024×768, looked at. Private annex; dates computed from today.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { createStaff, STAFF_PASSWORD } from '../helpers/midday'
import { addDays, todayIn } from '../../shared/utils/local-date'

let annex: Annex
let managerEmail: string
let providerName: string
let patientName: string
let browser: BrowserSession

beforeAll(async () => {
  annex = await createAnnex({ rooms: 2, providers: 0, patients: 1, timeZone: 'America/Denver' })
  const dentist = await createStaff('dentist', [annex.siteId], { provider: true })
  providerName = (await testDb()('users').where({ id: dentist.userId }).first('name')).name
  managerEmail = (await createStaff('manager', [annex.siteId])).email
  const today = todayIn(annex.timeZone)
  const admin = await signedInAs('admin@fernhollow.test')
  const entry = await admin.post('/api/waitlist', { patientId: annex.patientIds[0], siteId: annex.siteId, items: FILLING, from: today, to: addDays(today, 6), priority: 2, noticeMinutes: 0, partOfDay: 'morning' })
  expect(entry.status, JSON.stringify(entry.body)).toBe(201)
  const patient = await testDb()('patients').where({ id: annex.patientIds[0] }).first('first_name', 'last_name')
  patientName = `${patient.first_name} ${patient.last_name}`
  browser = await openBrowser(inject('baseURL'), { width: 1440, height: 900 })
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('new provider time and the waitlist', () => {
  it('an extra shift added on the Rota shows who on the waitlist fits it', async () => {
    const { page } = browser
    await signInThroughForm(page, managerEmail, STAFF_PASSWORD)
    await page.waitForURL(/\/chairboard/)
    await page.goto('/rota')
    await page.getByRole('button', { name: 'Time off or extra shift' }).click()
    const dialog = page.getByRole('dialog', { name: 'Time off or extra shift' })
    await dialog.waitFor()
    await dialog.getByLabel(/Extra shift at/).check()
    await dialog.getByLabel('Provider').selectOption({ label: providerName })
    const day = addDays(todayIn(annex.timeZone), 2)
    await dialog.getByLabel('From').fill(day)
    await dialog.getByLabel('To (inclusive)').fill(day)
    await dialog.getByLabel('During opening hours').uncheck()
    await dialog.getByLabel('Starts at').fill('09:00')
    await dialog.getByLabel('Ends at').fill('12:00')
    await dialog.getByRole('button', { name: 'Save' }).click()
    await expect.poll(() => page.getByRole('dialog').count()).toBe(0)

    const gap = page.getByTestId('waitlist-gap')
    await expect.poll(() => gap.textContent()).toContain('New provider time:')
    await expect.poll(() => gap.getByTestId('waitlist-fit-count').textContent()).toBe('1 on the waitlist fit')
    await gap.getByTestId('show-matches').click()
    const row = gap.getByTestId('waitlist-match-row')
    await expect.poll(() => row.textContent()).toContain(patientName)
    expect(await row.textContent()).toContain(providerName)
    await screenshot(page, 'waitlist-new-shift-1440')
    await page.setViewportSize({ width: 1024, height: 768 })
    await screenshot(page, 'waitlist-new-shift-1024')
  })
})
