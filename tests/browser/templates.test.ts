// A manager edits a template's per-surface minutes and watches the live preview change.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { ApiClient } from '../helpers/api-client'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'

let browser: BrowserSession

beforeAll(async () => { browser = await openBrowser(inject('baseURL')) })
afterAll(async () => { await browser?.close() })

async function chairTotal(): Promise<number> {
  const text = await browser.page.getByTestId('total-chair').textContent()
  return Number.parseInt(text ?? '', 10)
}

describe('Templates screen', () => {
  it('shows the preview of a default template and changes it as per-surface minutes change', async () => {
    // Our own copy of the posterior composite, so other tests keep the seeded one.
    const api = new ApiClient(inject('baseURL'))
    await api.signIn('manager@fernhollow.test')
    const seeded = (await api.get('/api/templates')).body.find((template: { code: string }) => template.code === 'COMP-POST')
    const { id, version, current, active, createdAt, ...copy } = seeded
    expect((await api.post('/api/templates', { ...copy, code: 'COMP-POST-UI', name: 'Posterior composite (UI test)' })).status).toBe(201)

    const { page } = browser
    await signInThroughForm(page, 'manager@fernhollow.test')
    await page.waitForURL(/\/chairboard$/)
    await page.goto('/templates')
    await page.getByTestId('template-row-COMP-POST-UI').click()
    await expect.poll(() => page.getByTestId('timeline-bar').isVisible()).toBe(true)
    expect(await page.getByTestId('timeline-bar').locator('[data-kind="numbing"]').count()).toBeGreaterThan(0)

    await page.getByLabel('Surfaces').selectOption('3')
    const before = await chairTotal()
    const perSurface = page.getByTestId('step-1').getByLabel('Per extra surface')
    const oldValue = Number(await perSurface.inputValue())
    await perSurface.fill(String(oldValue + 10))
    // Two extra surfaces at +10 min each: 20 more minutes, rounded to the booking unit.
    await expect.poll(chairTotal).toBeGreaterThanOrEqual(before + 20)
    await screenshot(page, 'templates-preview-edited')

    await page.getByRole('button', { name: 'Save as new version' }).click()
    await expect.poll(() => page.getByTestId('template-notice').textContent()).toMatch(/version 2/)
  })

  it('shows the clinical caution and lets front desk read without editing', async () => {
    const { page } = browser
    await page.getByRole('button', { name: 'Sign out' }).click()
    await page.waitForURL(/\/sign-in/)
    await signInThroughForm(page, 'desk.quarry@fernhollow.test')
    await page.waitForURL(/\/chairboard$/)
    await page.goto('/templates')
    expect(await page.getByRole('note').textContent()).toMatch(/clinician/)
    await page.getByTestId('template-row-COMP-POST').click()
    await expect.poll(() => page.getByTestId('timeline-bar').isVisible()).toBe(true)
    expect(await page.getByRole('button', { name: 'Save as new version' }).count()).toBe(0)
    expect(await page.getByLabel('Name').isDisabled()).toBe(true)
  })
})
