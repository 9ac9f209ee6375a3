// Issue 14, "Other screens", in real Chromium at 1440×900 and 1024×768: the Outbox searched by
// patient and paged; Balance figures that link to their Chairboard day and Rota week, with no-show
// and late-cancellation rates; the Templates preview staying in view while a step far down is edited,
// with one problem per invalid field.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { bookingFor, createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { atAhead, weekdayAhead, FRIDAY, MONDAY } from '../helpers/dates'

const VIEWPORTS = [{ width: 1440, height: 900 }, { width: 1024, height: 768 }]
let browser: BrowserSession
let annex: MailAnnex
let searchName: string

beforeAll(async () => {
  // A private site whose 20 visits (60 messages) fill more than one Outbox page (50 a page); no mail
  // is sent (a lane of its own). Four visits a day, Monday to Friday, one chair and one provider.
  annex = await createMailAnnex({ patients: 3, mailLane: 'outbox-balance-templates' })
  searchName = `Zaccheus${Date.now() % 10_000}`
  await testDb()('patients').where({ id: annex.patientIds[2] }).update({ first_name: searchName })
  const manager = await signedInAs('manager@fernhollow.test')
  for (let index = 0; index < 20; index += 1) {
    const weekday = MONDAY + Math.floor(index / 4)
    const time = ['08:00', '09:30', '11:00', '12:30'][index % 4]!
    const booked = await manager.post('/api/visits', bookingFor(annex, index % 3, atAhead(2, weekday, time, annex.timeZone)))
    expect(booked.status, `weekday ${weekday} ${time}: ${JSON.stringify(booked.body)}`).toBe(201)
  }
  browser = await openBrowser(inject('baseURL'))
  await signInThroughForm(browser.page, 'manager@fernhollow.test')
  await browser.page.waitForURL((url) => url.pathname !== '/sign-in')
  await browser.context.addCookies([{ name: 'cuspline-site', value: String(annex.siteId), url: inject('baseURL') }])
})
afterAll(async () => { await browser?.close(); await closeTestDb() })

describe('Outbox: search by patient and paging', () => {
  for (const viewport of VIEWPORTS) {
    it(`pages on with "Show older" and finds one patient's messages at ${viewport.width}×${viewport.height}`, async () => {
      const { page } = browser
      await page.setViewportSize(viewport)
      await page.goto('/outbox')
      const rows = page.locator('[data-testid^="outbox-row-"]')
      await expect.poll(() => rows.count()).toBe(50)
      const total = await testDb()('outbox').where({ site_id: annex.siteId }).count({ n: '*' }).first()
      expect(Number(total!.n)).toBeGreaterThan(50)
      await page.getByTestId('outbox-older').click()
      await expect.poll(() => rows.count()).toBe(Math.min(100, Number(total!.n)))
      const ids = await rows.evaluateAll((elements) => elements.map((element) => Number(element.getAttribute('data-testid')!.replace('outbox-row-', ''))))
      expect(new Set(ids).size).toBe(ids.length)
      expect([...ids].sort((a, b) => b - a)).toEqual(ids)

      await page.getByTestId('outbox-patient-search').fill(searchName.toLowerCase())
      await expect.poll(async () => (await rows.allTextContents()).every((text) => text.includes(searchName))).toBe(true)
      expect(await rows.count()).toBeGreaterThan(0)
      await screenshot(page, `outbox-search-${viewport.width}`)
      await page.getByTestId('outbox-patient-search').fill('Nobodyatall')
      await expect.poll(() => page.getByTestId('outbox-empty').textContent()).toBe('No messages for “Nobodyatall”.')
      await page.getByTestId('outbox-patient-search').fill('')
    })
  }
})

describe('Balance: rates and links', () => {
  for (const viewport of VIEWPORTS) {
    it(`shows no-show and late-cancellation rates and opens the Chairboard day and the Rota week at ${viewport.width}×${viewport.height}`, async () => {
      const { page } = browser
      await page.setViewportSize(viewport)
      const day = weekdayAhead(2, MONDAY, annex.timeZone)
      const name = (await testDb()('sites').where({ id: annex.siteId }).first()).name
      await page.goto('/balance')
      await page.getByLabel('From', { exact: true }).fill(day)
      await page.getByLabel('To', { exact: true }).fill(weekdayAhead(2, FRIDAY, annex.timeZone))
      const card = page.getByRole('article', { name })
      await expect.poll(() => card.getByTestId('balance-late-cancel').textContent()).toMatch(/^0 % \(0 of 20 visits\)$/)
      // Nothing was due yet: the visits are ahead.
      expect(await card.getByTestId('balance-missed').textContent()).toBe('— (0 of 0 due)')
      await screenshot(page, `balance-rates-${viewport.width}`)
      await card.locator(`[data-testid="balance-day"][data-date="${day}"] a`).click()
      await page.waitForURL((url) => url.pathname === '/chairboard')
      await expect.poll(() => page.locator('#board-date').inputValue()).toBe(day)
      await expect.poll(() => page.getByTestId('site-switcher').locator('option:checked').textContent()).toBe(name)
      await page.goto('/balance')
      await page.getByLabel('From', { exact: true }).fill(day)
      await page.getByLabel('To', { exact: true }).fill(weekdayAhead(2, FRIDAY, annex.timeZone))
      const provider = card.getByTestId('balance-row').filter({ hasText: 'Dr. Annex' }).getByRole('link')
      await provider.click()
      await page.waitForURL((url) => url.pathname === '/rota' && url.searchParams.get('provider') === String(annex.providerIds[0]))
      await expect.poll(() => page.getByTestId('week-label').textContent()).toMatch(/\d/)
    })
  }
})

describe('Templates: the preview stays in view, one problem per field', () => {
  for (const viewport of VIEWPORTS) {
    it(`keeps the timeline on screen while the last step is edited at ${viewport.width}×${viewport.height}`, async () => {
      const { page } = browser
      await page.setViewportSize(viewport)
      await page.goto('/templates')
      await page.getByTestId('template-row-COMP-POST').click()
      await expect.poll(() => page.getByTestId('timeline-bar').isVisible()).toBe(true)
      const steps = page.locator('[data-testid^="step-"]')
      const last = steps.nth((await steps.count()) - 1)
      const label = last.getByLabel('Label')
      await label.scrollIntoViewIfNeeded()
      await label.fill('')
      // The preview (now naming the problem instead of a timeline) is still inside the viewport.
      const bar = await page.getByTestId('template-preview-sticky').boundingBox()
      expect(bar!.y).toBeGreaterThanOrEqual(-1)
      expect(bar!.y + bar!.height).toBeLessThanOrEqual(viewport.height)
      // One problem under the emptied field, and the count of fields to fix says one.
      expect(await last.locator('.field-error').allTextContents()).toEqual(['A step needs a label'])
      await expect.poll(() => page.getByText('One problem to fix before saving.').count()).toBe(1)
      await screenshot(page, `templates-sticky-preview-${viewport.width}`)
      await page.getByRole('button', { name: 'Cancel' }).click()
    })
  }
})
