// Issue 14 on real screens, in real Chromium at 1440×900 and 1024×768: the visit card of our own
// (bands across the whole card, a legend), the visit panel in view as a side sheet (focus in, Escape
// back), the navigation collapsed on a tablet, a one-line toolbar, the current-time line across every
// chair, "Show cancelled", a refused move's reason in view however far the page is scrolled, and My day
// with four chairs and a short visit whose "Mark arrived" can be pressed.
// All in a test annex of its own whose zone makes it late morning now (tests/helpers/midday.ts).
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession, type Page } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { createStaff, middayZone, STAFF_PASSWORD, startIn } from '../helpers/midday'

let annex: Annex
let desk: { email: string }
let dentistEmail: string
const visits: Record<string, { id: number; name: string }> = {}

async function book(key: string, body: Record<string, unknown>, patientIndex: number) {
  const admin = await signedInAs('admin@fernhollow.test')
  const booked = await admin.post('/api/visits', { siteId: annex.siteId, providerId: annex.providerIds[0], patientId: annex.patientIds[patientIndex], ...body })
  expect(booked.status, JSON.stringify(booked.body)).toBe(201)
  const patient = await testDb()('patients').where({ id: annex.patientIds[patientIndex] }).first('first_name', 'last_name')
  visits[key] = { id: booked.body.id, name: `${patient.first_name} ${patient.last_name}` }
  return booked.body as { id: number; rowVersion: number }
}

beforeAll(async () => {
  annex = await createAnnex({ rooms: 4, providers: 1, patients: 6, timeZone: middayZone() })
  desk = await createStaff('front_desk', [annex.siteId])
  const dentist = await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('providers.id', annex.providerIds[0]).first('users.email')
  dentistEmail = dentist.email
  const [room1, room2, room3, room4] = annex.operatoryIds
  // One dentist, so the times never overlap: the short visit first (it can be marked arrived now).
  // A short visit: 30 minutes by hand (its length override), in the fourth chair.
  const short = await book('short', { operatoryId: room4, startUtc: startIn(40), items: [{ templateCode: 'EXAM-EMER' }] }, 3)
  await book('filling', { operatoryId: room1, startUtc: startIn(150), items: FILLING }, 0)
  await book('second', { operatoryId: room2, startUtc: startIn(250), items: [{ templateCode: 'EXAM-EMER' }] }, 1)
  await book('third', { operatoryId: room3, startUtc: startIn(310), items: [{ templateCode: 'EXAM-EMER' }] }, 2)
  const admin = await signedInAs('admin@fernhollow.test')
  const shortened = await admin.patch(`/api/visits/${short.id}`, { rowVersion: short.rowVersion, lengthOverride: { chairMinutes: 30, reason: 'quick look only' } })
  expect(shortened.status, JSON.stringify(shortened.body)).toBe(200)
  const cancelled = await book('cancelled', { operatoryId: room2, startUtc: startIn(380), items: [{ templateCode: 'EXAM-EMER' }] }, 4)
  const cancel = await admin.post(`/api/visits/${cancelled.id}/cancel`, { reason: 'Patient has the flu' })
  expect(cancel.status, JSON.stringify(cancel.body)).toBe(200)
})
afterAll(async () => {
  await closeTestDb()
})

const inViewport = async (page: Page, selector: string) => {
  const box = await page.locator(selector).first().boundingBox()
  const size = page.viewportSize()!
  return box !== null && box.y >= 0 && box.y + Math.min(box.height, 40) <= size.height && box.x >= 0 && box.x + box.width <= size.width + 1
}
const visitButton = (page: Page, key: string) => page.locator(`[data-board-visit="${visits[key]!.id}"]`)

for (const viewport of [{ width: 1440, height: 900 }, { width: 1024, height: 768 }]) {
  const size = `${viewport.width}x${viewport.height}`
  describe(`the Chairboard at ${size}`, () => {
    let browser: BrowserSession
    beforeAll(async () => {
      browser = await openBrowser(inject('baseURL'), viewport)
      await signInThroughForm(browser.page, desk.email, STAFF_PASSWORD)
      await browser.page.waitForURL(/\/chairboard$/)
      await visitButton(browser.page, 'filling').waitFor()
    })
    afterAll(async () => { await browser?.close() })

    it('draws each visit as our own card: segment bands across the whole card, no edge strip, and a legend', async () => {
      const { page } = browser
      const card = page.locator(`[data-testid="visit-block"][data-visit-id="${visits.filling!.id}"]`)
      const cardBox = (await card.boundingBox())!
      const kinds = await card.locator('[data-kind]').evaluateAll((bands) => bands.map((band) => band.getAttribute('data-kind')))
      expect(kinds).toContain('numbing')
      expect(kinds).toContain('hands_on')
      expect(kinds).toContain('reset')
      // Every band spans the card's full width (glossary, "Visual language": never a narrow strip).
      for (const band of await card.locator('[data-kind]').all()) {
        const box = (await band.boundingBox())!
        expect(Math.abs(box.width - cardBox.width)).toBeLessThanOrEqual(2)
      }
      const legend = page.getByTestId('visit-legend')
      expect(await legend.textContent()).toMatch(/Provider at the chair.*Assistant only.*Numbing wait.*Room reset/)
      expect(await legend.textContent()).toContain('clinician decide')
      // Names and tooth with surfaces are shown whole, not cut.
      expect(await card.getByTestId('visit-name').evaluate((element) => element.scrollWidth <= element.clientWidth + 1)).toBe(true)
      expect(await card.getByTestId('visit-procedure').first().textContent()).toMatch(/19|36/)
      await card.screenshot({ path: `tests/artifacts/board-ux-card-${size}.png` })
    })

    it('keeps the toolbar on one line and collapses the navigation on a tablet', async () => {
      const { page } = browser
      const toolbar = (await page.getByTestId('board-toolbar').boundingBox())!
      expect(toolbar.height).toBeLessThan(48)
      const menu = page.getByTestId('nav-menu')
      if (viewport.width < 1280) {
        expect(await menu.isVisible()).toBe(true)
        expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Chairboard' }).isVisible()).toBe(false)
        await menu.click()
        expect(await menu.getAttribute('aria-expanded')).toBe('true')
        expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Chairboard' }).isVisible()).toBe(true)
        await screenshot(page, `board-ux-menu-open-${size}`)
        await menu.click()
      } else {
        expect(await menu.isVisible()).toBe(false)
      }
    })

    it('draws the current-time line across every chair', async () => {
      const { page } = browser
      await expect.poll(() => page.locator('.board-calendar .board-now').count()).toBe(4)
      const tops = await page.locator('.board-calendar .board-now').evaluateAll((lines) => lines.map((line) => Math.round(line.getBoundingClientRect().top)))
      expect(new Set(tops).size).toBe(1)
    })

    it('opens a clicked visit\'s panel in view with focus inside; Escape closes it and returns focus to the visit', async () => {
      const { page } = browser
      await visitButton(page, 'second').scrollIntoViewIfNeeded()
      await visitButton(page, 'second').click()
      const panel = page.getByTestId('visit-panel')
      await panel.waitFor()
      await expect.poll(() => inViewport(page, '[data-testid="visit-panel"]')).toBe(true)
      await expect.poll(() => page.evaluate(() => Boolean(document.activeElement?.closest('[data-testid="visit-panel"]')))).toBe(true)
      expect(await panel.getByLabel('Provider').count()).toBe(1)
      await screenshot(page, `board-ux-panel-${size}`)
      await page.keyboard.press('Escape')
      await panel.waitFor({ state: 'detached' })
      await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('data-board-visit'))).toBe(String(visits.second!.id))
    })

    it('shows cancelled visits greyed with their reason when asked', async () => {
      const { page } = browser
      const cancelled = page.locator(`[data-testid="visit-block"][data-visit-id="${visits.cancelled!.id}"]`)
      expect(await cancelled.count()).toBe(0)
      await page.getByTestId('show-cancelled').check()
      await cancelled.waitFor()
      expect(await cancelled.getAttribute('data-state')).toBe('cancelled')
      expect(await cancelled.getByTestId('cancel-reason').textContent()).toContain('Patient has the flu')
      expect(await cancelled.evaluate((element) => getComputedStyle(element).filter)).toContain('grayscale')
      await cancelled.screenshot({ path: `tests/artifacts/board-ux-cancelled-${size}.png` })
      await page.getByTestId('show-cancelled').uncheck()
      await cancelled.waitFor({ state: 'detached' })
    })

    it('shows a refused move\'s reason in view, in plain words, and announces it', async () => {
      const { page } = browser
      await visitButton(page, 'third').scrollIntoViewIfNeeded()
      await visitButton(page, 'third').click()
      const panel = page.getByTestId('visit-panel')
      await panel.waitFor()
      // Onto the filling's chair and time: the server refuses (409) and says why.
      const filling = await testDb()('visits').where({ id: visits.filling!.id }).first('start_utc')
      const startLocal = new Date(filling.start_utc)
      const { DateTime } = await import('luxon')
      const local = DateTime.fromJSDate(startLocal).setZone(annex.timeZone)
      await panel.getByLabel('Chair').selectOption({ label: 'Room 1' })
      await panel.getByLabel('Start').fill(local.toFormat('HH:mm'))
      await page.evaluate(() => window.scrollTo(0, document.body.scrollHeight))
      await panel.getByRole('button', { name: 'Move visit' }).click()
      const notice = page.getByTestId('board-notice')
      await expect.poll(() => notice.getAttribute('data-kind')).toBe('error')
      expect(await notice.textContent()).not.toMatch(/operatoryId|providerId|startUtc/)
      await expect.poll(() => inViewport(page, '[data-testid="board-notice"]')).toBe(true)
      expect(await page.locator('[role="status"][aria-live="polite"]').filter({ has: notice }).count()).toBe(1)
      await screenshot(page, `board-ux-refused-move-${size}`)
      await page.keyboard.press('Escape')
    })
  })
}

describe('My day at 1440×900 with four chairs and a short visit', () => {
  let browser: BrowserSession
  beforeAll(async () => {
    browser = await openBrowser(inject('baseURL'), { width: 1440, height: 900 })
    await signInThroughForm(browser.page, dentistEmail, 'annex-provider-password')
    await browser.page.waitForURL(/\/my-day$/)
  })
  afterAll(async () => { await browser?.close() })

  it('shows all four chair columns and the short visit\'s "Mark arrived" unclipped and pressable', async () => {
    const { page } = browser
    await expect.poll(() => page.getByTestId('chair-column').count()).toBe(4)
    const grid = (await page.getByTestId('myday-grid').boundingBox())!
    const last = (await page.getByTestId('chair-column').nth(3).boundingBox())!
    expect(last.x + last.width).toBeLessThanOrEqual(grid.x + grid.width + 1)
    expect(await page.getByTestId('myday-grid').evaluate((element) => element.scrollWidth <= element.clientWidth + 1)).toBe(true)
    const short = page.locator(`[data-testid="myday-visit"][data-visit-id="${visits.short!.id}"]`)
    expect(await short.getAttribute('data-compact')).toBe('true')
    const button = short.getByRole('button', { name: new RegExp(`Mark arrived: ${visits.short!.name}`) })
    const cardBox = (await short.boundingBox())!
    const buttonBox = (await button.boundingBox())!
    expect(buttonBox.y).toBeGreaterThanOrEqual(cardBox.y)
    expect(buttonBox.y + buttonBox.height).toBeLessThanOrEqual(cardBox.y + cardBox.height + 1)
    // WCAG 2.2 §2.5.8 Target Size (Minimum): at least 24×24 CSS px.
    expect(buttonBox.height).toBeGreaterThanOrEqual(24)
    await short.screenshot({ path: 'tests/artifacts/board-ux-myday-short.png' })
    await screenshot(page, 'board-ux-myday-1440x900')
    await button.click()
    await expect.poll(async () => (await testDb()('visits').where({ id: visits.short!.id }).first('state')).state).toBe('arrived')
  })
})
