// The Rota week as a manager sees it, in real Chromium: add a shift without typing a rule.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'
import { createTestProvider } from '../helpers/rota'
import { addDays } from '../../shared/utils/local-date'
import { formatLocalDate } from '../../shared/utils/display-time'

let browser: BrowserSession
let provider: Awaited<ReturnType<typeof createTestProvider>>

beforeAll(async () => {
  browser = await openBrowser(inject('baseURL'))
  // A fresh dentist at Aspen Gulch only, so the week shows exactly the shift this test adds.
  provider = await createTestProvider(['aspen-gulch'], `Dr. Wren Ashdown ${randomUUID().slice(0, 4)}`)
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('Rota', () => {
  it('lets a manager add "every Tuesday and Thursday 07:30–16:00" at Aspen Gulch and see it on the week', async () => {
    const { page } = browser
    await signInThroughForm(page, 'manager@fernhollow.test')
    await page.waitForURL(/\/chairboard$/)
    const aspen = await siteIdBySlug('aspen-gulch')
    await page.getByTestId('site-switcher').selectOption(String(aspen))
    await page.getByRole('link', { name: 'Rota' }).click()
    await page.waitForURL(/\/rota$/)
    await expect.poll(() => page.getByText(/^Fernhollow Aspen Gulch · times in Mountain time, UTC\u2212[67]$/).count()).toBe(1)

    await page.getByRole('button', { name: 'Add shift' }).click()
    await expect.poll(() => page.getByRole('dialog', { name: 'Add shift' }).isVisible()).toBe(true)
    const form = page.getByRole('dialog', { name: 'Add shift' }).getByTestId('shift-form')
    await form.getByLabel('Provider').selectOption({ label: `${provider.name} (dentist)` })
    await form.getByLabel('Tuesday').check({ force: true })
    await form.getByLabel('Thursday').check({ force: true })
    await expect.poll(() => form.getByTestId('rule-in-words').textContent()).toBe('Repeats every Tuesday and Thursday')
    await form.getByLabel('Starts at').fill('07:30')
    await form.getByLabel('Ends at').fill('16:00')
    await screenshot(page, 'rota-shift-form')
    await form.getByRole('button', { name: 'Save shift' }).click()
    await expect.poll(() => page.getByRole('dialog').count()).toBe(0)

    // Cards carry the full name in their label (three shifts side by side show initials only).
    const mine = page.locator(`[data-testid="rota-entry"][aria-label^="${provider.name},"]`)
    await expect.poll(() => mine.count()).toBe(2)
    const labels = await mine.evaluateAll((cards) => cards.map((card) => card.getAttribute('aria-label')))
    expect(labels).toEqual([
      expect.stringMatching(new RegExp(`^${provider.name}, 07:30–16:00, Tue\\b`)),
      expect.stringMatching(new RegExp(`^${provider.name}, 07:30–16:00, Thu\\b`)),
    ])
    expect(await page.getByTestId('shift-rules').textContent()).toContain('every Tuesday and Thursday, 07:30–16:00')

    const stored = await testDb()('shifts').where({ provider_id: provider.providerId }).first()
    expect(stored).toMatchObject({ site_id: aspen, rrule: 'FREQ=WEEKLY;BYDAY=TU,TH', local_start: '07:30', local_end: '16:00' })
    await screenshot(page, 'rota-aspen-week')
  })

  it('opens the shift from the grid, names a bad end time, and shows a clash with another site', async () => {
    const { page } = browser
    await page.locator(`[data-testid="rota-entry"][aria-label^="${provider.name},"]`).first().click()
    const form = page.getByRole('dialog', { name: 'Change shift' }).getByTestId('shift-form')
    await expect.poll(() => form.getByLabel('Starts at').inputValue()).toBe('07:30')
    await form.getByLabel('Starts at').fill('18:00')
    await form.getByRole('button', { name: 'Save changes' }).click()
    await expect.poll(() => form.locator('.field-error').first().textContent()).toBe('must be after the start time')

    // The same provider also works Tuesday mornings at Saguaro Flats (set up behind the UI's back).
    const stored = await testDb()('shifts').where({ provider_id: provider.providerId }).first()
    const saguaro = await siteIdBySlug('saguaro-flats')
    await testDb()('shifts').insert({ provider_id: provider.providerId, site_id: saguaro, rrule: 'FREQ=WEEKLY;BYDAY=TU', valid_from: '2026-01-06', valid_until: null, local_start: '07:00', local_end: '12:00' })
    const firstTuesday = addDays(stored.valid_from, 1)
    // The refusal reads the date in the order of the shift's own site.
    const ownSite = await testDb()('sites').where({ id: stored.site_id }).first('date_order')
    await form.getByLabel('Starts at').fill('08:00')
    await form.getByRole('button', { name: 'Save changes' }).click()
    await expect.poll(() => form.getByTestId('form-problem').textContent())
      .toBe(`${provider.name} already works at Fernhollow Saguaro Flats on ${formatLocalDate(firstTuesday, { dateOrder: ownSite.date_order }, 'medium')} at that time.`)
    await screenshot(page, 'rota-shift-clash')
    await testDb()('shifts').where({ provider_id: provider.providerId, site_id: saguaro }).delete()
    await form.getByRole('button', { name: 'Cancel' }).click()
  })

  it('shows one provider\'s week across sites, each shift labelled with its site', async () => {
    const { page } = browser
    await page.getByRole('button', { name: 'One provider' }).click()
    const dentist = await testDb()('users').where({ email: 'dentist@fernhollow.test' }).first('name')
    await page.getByLabel('Provider to show').selectOption({ label: dentist.name })
    const cards = page.getByTestId('rota-entry')
    // The demo dentist: Quarry Street Mon, Tue, Thu and Saguaro Flats Wed, Fri (seeds/03-rota.ts).
    await expect.poll(async () => (await cards.allTextContents()).map((text) => text.replace(/\d.*$/, ''))).toEqual([
      'Fernhollow Quarry Street', 'Fernhollow Quarry Street', 'Fernhollow Saguaro Flats', 'Fernhollow Quarry Street', 'Fernhollow Saguaro Flats',
    ])
    await screenshot(page, 'rota-provider-week')
  })
})
