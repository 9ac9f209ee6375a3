// Issue 17 §2 on screen: new provider time reaches the waitlist. A manager adds an extra shift on the
// Rota screen for a site where nobody works that day; the saved shift's window is asked of the waitlist
// and the screen says how many waiting patients fit it, with their names on "Show who fits". And a
// visit made shorter on the Chairboard shows its freed tail with the waiting patients who fit it.
// Screenshots at 1440×900 and 1024×768, looked at. Private annex; dates computed from today.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { createStaff, middayZone, startIn, STAFF_PASSWORD } from '../helpers/midday'
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

describe('a shortened visit and the waitlist', () => {
  it('making a visit shorter on the Chairboard shows who on the waitlist fits its freed tail', async () => {
    const board = await createAnnex({ rooms: 1, providers: 1, patients: 2, timeZone: middayZone() })
    const deskEmail = (await createStaff('front_desk', [board.siteId])).email
    const admin = await signedInAs('admin@fernhollow.test')
    const booked = await admin.post('/api/visits', { siteId: board.siteId, operatoryId: board.operatoryIds[0], providerId: board.providerIds[0], patientId: board.patientIds[0], items: FILLING, startUtc: startIn(150) })
    expect(booked.status, JSON.stringify(booked.body)).toBe(201)
    const planned = (Date.parse(booked.body.endUtc) - Date.parse(booked.body.startUtc)) / 60_000
    // Set longer by hand first (the plan's own length is the shortest a visit may be).
    const longer = await admin.patch(`/api/visits/${booked.body.id}`, { rowVersion: booked.body.rowVersion, lengthOverride: { chairMinutes: planned + 60, reason: 'extra time for a nervous patient' } })
    expect(longer.status, JSON.stringify(longer.body)).toBe(200)
    const today = todayIn(board.timeZone)
    const entry = await admin.post('/api/waitlist', { patientId: board.patientIds[1], siteId: board.siteId, items: FILLING, from: today, to: addDays(today, 3), priority: 1, noticeMinutes: 0, partOfDay: 'any' })
    expect(entry.status, JSON.stringify(entry.body)).toBe(201)
    const name = async (index: number) => {
      const row = await testDb()('patients').where({ id: board.patientIds[index] }).first('first_name', 'last_name')
      return `${row.first_name} ${row.last_name}`
    }

    const desk = await openBrowser(inject('baseURL'), { width: 1440, height: 900 })
    try {
      const { page } = desk
      await signInThroughForm(page, deskEmail, STAFF_PASSWORD)
      await page.waitForURL(/\/chairboard/)
      await page.getByRole('button', { name: `Open the visit of ${await name(0)}` }).first().click()
      const panel = page.getByTestId('visit-panel')
      await panel.getByLabel('Minutes').fill(String(planned))
      await panel.getByLabel('Reason', { exact: true }).fill('the nervous patient is calmer now')
      await panel.getByRole('button', { name: 'Change length' }).click()
      const gap = page.getByTestId('waitlist-gap')
      await expect.poll(() => gap.getByTestId('waitlist-fit-count').textContent()).toBe('1 on the waitlist fit')
      expect(await gap.textContent()).toContain('This time is free again')
      await gap.getByTestId('show-matches').click()
      await expect.poll(() => gap.getByTestId('waitlist-match-row').textContent()).toContain(await name(1))
      await screenshot(page, 'waitlist-shortened-1440')
      await page.setViewportSize({ width: 1024, height: 768 })
      await screenshot(page, 'waitlist-shortened-1024')
    } finally {
      await desk.close()
    }
  })
})
