// Dates, times and words (issue 14), in real Chromium at 1440×900 and 1024×768: the header names the
// site's zone as people say it; each site's own clock on its board (Quarry Street 12-hour, Aspen
// Gulch 24-hour in the demo); Sites & rooms sets the clock and date order; patient search finds
// "09/13/1973" as well as "1973-09-13"; a birth date typed in the site's order registers.
// Zone offsets: IANA time zone database (check-values.md).
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, type Annex } from '../helpers/booking-fixtures'

const VIEWPORTS = [{ width: 1440, height: 900 }, { width: 1024, height: 768 }]
let browser: BrowserSession
let annex: Annex
let lastName: string
// Closed dates must lie within the input bounds (today + 3 years): next year's, from today.
const nextYear = new Date().getUTCFullYear() + 1

beforeAll(async () => {
  annex = await createAnnex({ rooms: 1, patients: 1, timeZone: 'America/Denver' })
  lastName = `Vantongeren${randomUUID().slice(0, 4)}`
  // A birth date no demo patient has (theirs are generated between 1940 and 2020).
  await testDb()('patients').where({ id: annex.patientIds[0] }).update({ last_name: lastName, date_of_birth: '1903-09-13' })
  browser = await openBrowser(inject('baseURL'))
})
afterAll(async () => { await browser?.close(); await closeTestDb() })

describe('the site clock and zone on screens', () => {
  for (const viewport of VIEWPORTS) {
    it(`shows Quarry Street in Pacific time on a 12-hour clock at ${viewport.width}×${viewport.height}`, async () => {
      const { page, context } = browser
      await context.clearCookies()
      await page.setViewportSize(viewport)
      await signInThroughForm(page, 'desk.quarry@fernhollow.test')
      await page.waitForURL(/\/chairboard$/)
      await expect.poll(() => page.getByTestId('site-zone').textContent()).toMatch(/^Pacific time, UTC−[78]$/)
      expect(await page.getByTestId('site-zone').getAttribute('title')).toBe('America/Los_Angeles')
      await page.locator('.fc-timegrid-slot-label').first().waitFor()
      const labels = (await page.locator('.fc-timegrid-slot-label-cushion').allTextContents()).filter(Boolean)
      expect(labels).toContain('8:00 AM')
      expect(labels).toContain('1:00 PM')
      await screenshot(page, `dates-quarry-12h-${viewport.width}`)
    })

    it(`shows Aspen Gulch in Mountain time on a 24-hour clock at ${viewport.width}×${viewport.height}`, async () => {
      const { page, context } = browser
      await context.clearCookies()
      await page.setViewportSize(viewport)
      await signInThroughForm(page, 'desk.aspen@fernhollow.test')
      await page.waitForURL(/\/chairboard$/)
      await expect.poll(() => page.getByTestId('site-zone').textContent()).toMatch(/^Mountain time, UTC−[67]$/)
      await page.locator('.fc-timegrid-slot-label').first().waitFor()
      const labels = (await page.locator('.fc-timegrid-slot-label-cushion').allTextContents()).filter(Boolean)
      expect(labels).toContain('08:00')
      expect(labels).toContain('13:00')
      await screenshot(page, `dates-aspen-24h-${viewport.width}`)
    })
  }
})

describe('Sites & rooms: clock and date order', () => {
  it('saves a site\'s clock and date order and shows closed dates in that order', async () => {
    const { page, context } = browser
    await context.clearCookies()
    await page.setViewportSize(VIEWPORTS[0]!)
    await signInThroughForm(page, 'admin@fernhollow.test')
    await page.waitForURL((url) => url.pathname !== '/sign-in')
    await page.goto('/sites')
    const name = (await testDb()('sites').where({ id: annex.siteId }).first()).name
    await page.getByTestId('site-rows').getByRole('button', { name }).click()
    await page.getByRole('button', { name: 'Change site' }).click()
    const form = page.getByTestId('site-form')
    await form.getByLabel('Clock').selectOption('24h')
    await form.getByLabel('Date order').selectOption('day-month-year')
    await form.getByLabel(/^Closed dates/).fill(`25/12/${nextYear}, ${nextYear + 1}-01-01`)
    await screenshot(page, 'sites-clock-date-order')
    await form.getByRole('button', { name: 'Save site' }).click()
    await expect.poll(async () => (await testDb()('sites').where({ id: annex.siteId }).first()).clock).toBe('24h')
    const stored = await testDb()('sites').where({ id: annex.siteId }).first()
    expect(stored.date_order).toBe('day-month-year')
    expect(typeof stored.closed_dates === 'string' ? JSON.parse(stored.closed_dates) : stored.closed_dates).toEqual([`${nextYear}-12-25`, `${nextYear + 1}-01-01`])
  })

  it('names a closed date it cannot read, in the site\'s order', async () => {
    const { page } = browser
    await page.goto('/sites')
    const name = (await testDb()('sites').where({ id: annex.siteId }).first()).name
    await page.getByTestId('site-rows').getByRole('button', { name }).click()
    expect(await page.getByTestId('site-summary').textContent()).toContain(`25/12/${nextYear}, 01/01/${nextYear + 1}`)
    expect(await page.getByTestId('site-summary').textContent()).toContain('24-hour clock')
    await page.getByRole('button', { name: 'Change site' }).click()
    const form = page.getByTestId('site-form')
    await expect.poll(() => form.getByLabel(/^Closed dates/).inputValue()).toBe(`25/12/${nextYear}, 01/01/${nextYear + 1}`)
    await form.getByLabel(/^Closed dates/).fill(`12/25/${nextYear}`)
    await form.getByRole('button', { name: 'Save site' }).click()
    await expect.poll(() => form.locator('.field-error').first().textContent()).toBe(`"12/25/${nextYear}" is not a date such as DD/MM/YYYY`)
  })
})

describe('patient search by birth date', () => {
  for (const viewport of VIEWPORTS) {
    it(`finds the patient by 09/13/1903 and by 1903-09-13 at ${viewport.width}×${viewport.height}`, async () => {
      const { page, context } = browser
      await context.clearCookies()
      await page.setViewportSize(viewport)
      await signInThroughForm(page, 'desk.quarry@fernhollow.test')
      await page.waitForURL(/\/chairboard$/)
      await page.goto('/patients')
      const search = page.getByLabel('Search by name, birth date (MM/DD/YYYY) or phone')
      for (const typed of ['09/13/1903', '1903-09-13']) {
        await search.fill(typed)
        await expect.poll(() => page.locator('#patient-results').textContent()).toContain(lastName)
        expect(await page.locator('#patient-results').textContent()).toContain('09/13/1903')
      }
      await screenshot(page, `patients-birth-date-search-${viewport.width}`)
    })
  }

  it('registers a birth date typed month first, and names the format when it cannot read one', async () => {
    const { page } = browser
    await page.goto('/patients')
    await page.getByRole('button', { name: 'New patient' }).click()
    await page.getByLabel('First name').fill('Wenonah')
    const last = `Pelletreau${randomUUID().slice(0, 4)}`
    await page.getByLabel('Last name').fill(last)
    await page.getByLabel('Birth date (MM/DD/YYYY)').fill('13/09/1961')
    await page.getByRole('button', { name: 'Register patient' }).click()
    await expect.poll(() => page.locator('.field-error').first().textContent()).toBe('must be a date such as MM/DD/YYYY')
    await page.getByLabel('Birth date (MM/DD/YYYY)').fill('09/13/1961')
    await page.getByRole('button', { name: 'Register patient' }).click()
    await expect.poll(async () => (await testDb()('patients').where({ last_name: last }).first())?.date_of_birth).toBe('1961-09-13')
  })
})
