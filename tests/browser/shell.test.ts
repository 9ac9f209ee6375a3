// The signed-in shell as a front-desk person sees it, in real Chromium against the built app.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'

let browser: BrowserSession

beforeAll(async () => { browser = await openBrowser(inject('baseURL')) })
afterAll(async () => { await browser?.close() })

describe('app shell', () => {
  it('sends a signed-out visitor to sign-in', async () => {
    await browser.page.goto('/rota')
    await browser.page.waitForURL((url) => url.pathname === '/sign-in' && url.searchParams.get('next') === '/rota')
    expect(await browser.page.getByRole('button', { name: 'Sign in' }).isVisible()).toBe(true)
  })

  it('shows a wrong password as an error beside the form', async () => {
    await signInThroughForm(browser.page, 'desk.quarry@fernhollow.test', 'not-the-password')
    await expect.poll(() => browser.page.getByTestId('sign-in-error').textContent()).toBe('E-mail or password is incorrect.')
  })

  it('signs in desk.quarry and shows the shell with Quarry Street selected', async () => {
    const { page } = browser
    await signInThroughForm(page, 'desk.quarry@fernhollow.test')
    await page.waitForURL(/\/chairboard$/)
    const switcher = page.getByTestId('site-switcher')
    await expect.poll(async () => switcher.locator('option:checked').textContent()).toBe('Fernhollow Quarry Street')
    expect(await switcher.locator('option').count()).toBe(1)
    expect(await page.getByTestId('user-role').textContent()).toBe('Front desk')
    const nav = page.getByRole('navigation', { name: 'Main' })
    // The Rebook list's label may carry its count ("3 visits need a new time").
    const labels = (await nav.getByRole('link').allTextContents()).map((text) => text.replace(/\s*\d+\s*visits need a new time$/, '').trim())
    expect(labels).toEqual(['Chairboard', 'Week', 'Templates', 'Rota', 'Patients', 'Outbox', 'Rebook list', 'Waitlist', 'Recall'])
    // The Chairboard has one column per Quarry Street room.
    await expect.poll(() => page.locator('th.fc-col-header-cell').allTextContents()).toEqual(['Chair 1', 'Chair 2', 'Chair 3', 'Hygiene A', 'Hygiene B'])
    await screenshot(page, 'shell-desk-quarry')
  })

  it('keeps front desk off the manager pages', async () => {
    await browser.page.goto('/balance')
    await browser.page.waitForURL(/\/chairboard$/)
  })

  it('signs out back to the sign-in page', async () => {
    await browser.page.getByRole('button', { name: 'Sign out' }).click()
    await browser.page.waitForURL(/\/sign-in/)
    await browser.page.goto('/chairboard')
    await browser.page.waitForURL(/\/sign-in/)
  })
})
