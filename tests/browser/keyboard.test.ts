// Issue 14, keyboard and single pointer (WCAG 2.2 AA), in real Chromium at 1440×900 and 1024×768:
// each visit is one Tab stop (§2.4.3 Focus Order), arrow keys move between visits, Enter moves focus
// into the visit's panel and Escape brings it back (§2.1.1 Keyboard); the panel's move form is the
// single-pointer alternative to dragging (§2.5.7 Dragging Movements) and can change the provider;
// targets are at least 24×24 CSS px (§2.5.8 Target Size (Minimum)).
// A test annex of its own, late morning now (tests/helpers/midday.ts).
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession, type Page } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { createStaff, middayZone, STAFF_PASSWORD, startIn } from '../helpers/midday'

let annex: Annex
let desk: { email: string }
let secondProviderName: string
const ids: Record<'early' | 'late' | 'beside', number> = { early: 0, late: 0, beside: 0 }

beforeAll(async () => {
  annex = await createAnnex({ rooms: 2, providers: 2, patients: 3, timeZone: middayZone() })
  desk = await createStaff('front_desk', [annex.siteId])
  const admin = await signedInAs('admin@fernhollow.test')
  const plan = [
    ['early', annex.operatoryIds[0], startIn(60), 0, annex.providerIds[0]],
    ['late', annex.operatoryIds[0], startIn(240), 1, annex.providerIds[0]],
    ['beside', annex.operatoryIds[1], startIn(300), 2, annex.providerIds[1]],
  ] as const
  for (const [key, operatoryId, startUtc, patient, providerId] of plan) {
    const booked = await admin.post('/api/visits', { siteId: annex.siteId, operatoryId, providerId, patientId: annex.patientIds[patient], items: FILLING, startUtc })
    expect(booked.status, JSON.stringify(booked.body)).toBe(201)
    ids[key] = booked.body.id
  }
  const second = await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('providers.id', annex.providerIds[1]).first('users.name')
  secondProviderName = second.name
})
afterAll(async () => { await closeTestDb() })

const focusedVisit = (page: Page) => page.evaluate(() => document.activeElement?.getAttribute('data-board-visit') ?? null)

for (const viewport of [{ width: 1440, height: 900 }, { width: 1024, height: 768 }]) {
  const size = `${viewport.width}x${viewport.height}`
  describe(`the Chairboard by keyboard at ${size}`, () => {
    let browser: BrowserSession
    beforeAll(async () => {
      browser = await openBrowser(inject('baseURL'), viewport)
      await signInThroughForm(browser.page, desk.email, STAFF_PASSWORD)
      await browser.page.waitForURL(/\/chairboard$/)
      await browser.page.locator(`[data-board-visit="${ids.early}"]`).waitFor()
    })
    afterAll(async () => { await browser?.close() })

    it('makes each visit exactly one Tab stop', async () => {
      const { page } = browser
      const stops = await page.locator('.fc-event.board-visit').evaluateAll((events) => events.map((event) => ({
        own: event.getAttribute('tabindex'),
        inner: event.querySelectorAll('a[href], button, input, select, [tabindex]:not([tabindex="-1"])').length,
      })))
      expect(stops).toHaveLength(3)
      for (const stop of stops) expect(stop).toEqual({ own: null, inner: 1 })
      await page.locator(`[data-board-visit="${ids.early}"]`).focus()
      await page.keyboard.press('Tab')
      const next = await focusedVisit(page)
      expect(next).not.toBe(String(ids.early))
      expect([String(ids.late), String(ids.beside)]).toContain(next)
    })

    it('moves between visits with the arrow keys', async () => {
      const { page } = browser
      await page.locator(`[data-board-visit="${ids.early}"]`).focus()
      await page.keyboard.press('ArrowDown')
      expect(await focusedVisit(page)).toBe(String(ids.late))
      await page.keyboard.press('ArrowUp')
      expect(await focusedVisit(page)).toBe(String(ids.early))
      await page.keyboard.press('ArrowRight')
      expect(await focusedVisit(page)).toBe(String(ids.beside))
      // Back to the nearest visit in time in the first chair: the later one (4 h from now, the other 5 h).
      await page.keyboard.press('ArrowLeft')
      expect(await focusedVisit(page)).toBe(String(ids.late))
    })

    it('Enter moves focus into the panel, whose targets are at least 24×24 px; Escape returns to the visit', async () => {
      const { page } = browser
      await page.locator(`[data-board-visit="${ids.beside}"]`).focus()
      await page.keyboard.press('Enter')
      const panel = page.getByTestId('visit-panel')
      await panel.waitFor()
      await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('data-testid'))).toBe('visit-panel-heading')
      // WCAG 2.2 §2.5.8: every button, link and field in the panel and the toolbar is at least 24×24.
      const small = await page.locator('[data-testid="visit-panel"] :is(button, a, select, input), [data-testid="board-toolbar"] :is(button, a, select, input:not([type="checkbox"]))')
        .evaluateAll((targets) => targets.filter((target) => {
          const box = target.getBoundingClientRect()
          return box.width > 0 && (box.width < 24 || box.height < 24)
        }).map((target) => target.outerHTML.slice(0, 80)))
      expect(small).toEqual([])
      await screenshot(page, `keyboard-panel-${size}`)
      await page.keyboard.press('Escape')
      await panel.waitFor({ state: 'detached' })
      expect(await focusedVisit(page)).toBe(String(ids.beside))
    })

    it('moves a visit to another provider from the panel, without dragging', async () => {
      const { page } = browser
      await page.locator(`[data-board-visit="${ids.early}"]`).focus()
      await page.keyboard.press('Enter')
      const panel = page.getByTestId('visit-panel')
      await panel.waitFor()
      const before = await testDb()('visits').where({ id: ids.early }).first('provider_id')
      const target = before.provider_id === annex.providerIds[0] ? annex.providerIds[1] : annex.providerIds[0]
      await panel.getByLabel('Provider').selectOption(String(target))
      await panel.getByRole('button', { name: 'Move visit' }).press('Enter')
      await expect.poll(async () => (await testDb()('visits').where({ id: ids.early }).first('provider_id')).provider_id).toBe(target)
      if (target === annex.providerIds[1]) await expect.poll(() => page.getByTestId('board-notice').textContent()).toContain(`with ${secondProviderName}`)
      await page.keyboard.press('Escape')
    })
  })
}
