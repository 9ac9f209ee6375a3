// Sites & rooms and People as an admin sees them, in real Chromium against the built app.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'

let browser: BrowserSession

beforeAll(async () => {
  browser = await openBrowser(inject('baseURL'))
  await signInThroughForm(browser.page, 'admin@fernhollow.test')
  await browser.page.waitForURL(/\/chairboard$/)
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('Sites & rooms', () => {
  it('sorts the sites by time zone and adds a room to Aspen Gulch', async () => {
    const { page } = browser
    await page.goto('/sites')
    const rows = page.getByTestId('site-rows').locator('tr')
    await expect.poll(() => rows.count()).toBeGreaterThanOrEqual(3)
    await page.getByRole('button', { name: /^Time zone/ }).click()
    const zones = await rows.locator('td:nth-child(2)').allTextContents()
    expect(zones).toEqual([...zones].sort((a, b) => a.localeCompare(b)))

    await page.getByTestId('site-rows').getByRole('button', { name: 'Fernhollow Aspen Gulch' }).click()
    await page.getByRole('button', { name: 'Add room' }).click()
    const name = `Test room ${randomUUID().slice(0, 4)}`
    const form = page.getByTestId('operatory-form')
    await form.getByLabel('Room name').fill(name)
    await form.getByLabel('imaging').check()
    await form.getByRole('button', { name: 'Add room' }).click()
    await expect.poll(() => page.getByTestId('operatory-rows').getByText(name).count()).toBe(1)
    const stored = await testDb()('operatories').where({ name }).first()
    expect(stored.site_id).toBe(await siteIdBySlug('aspen-gulch'))
    await screenshot(page, 'sites-aspen-rooms')
  })

  it('names a wrong time zone beside the field before sending', async () => {
    const { page } = browser
    await page.getByRole('button', { name: 'New site' }).click()
    const form = page.getByTestId('site-form')
    await form.getByLabel('Name').fill('Fernhollow Nowhere')
    await form.getByLabel('Time zone (IANA)').fill('Mars/Olympus_Mons')
    await form.getByRole('button', { name: 'Create site' }).click()
    await expect.poll(() => form.locator('.field-error').first().textContent()).toBe('is not an IANA time zone such as America/Denver')
    await screenshot(page, 'sites-new-site-error')
    await form.getByRole('button', { name: 'Cancel' }).click()
  })
})

describe('Patient e-mail and booking settings', () => {
  it('shows the defaults, names a wrong reminder list before sending, and keeps what was saved', async () => {
    const { page } = browser
    const name = `Larkspur annex ${randomUUID().slice(0, 6)}`
    // Closed (inactive): admins still see it here, and no other screen picks it as a default site.
    await testDb()('sites').insert({ name, slug: `larkspur-${randomUUID().slice(0, 6)}`, time_zone: 'America/Chicago', opening_hours: '{}', closed_dates: '[]', settings: '{}', active: false })
    await page.goto('/sites')
    await page.getByTestId('site-rows').getByRole('button', { name }).click()
    const form = page.getByTestId('site-settings')
    const reminders = form.getByLabel('Reminders, hours before the visit')
    await expect.poll(() => reminders.inputValue()).toBe('48, 3')
    expect(await form.getByLabel('Earliest start, minutes from now').inputValue()).toBe('60')

    await reminders.fill('24, 24')
    await form.getByRole('button', { name: 'Save settings' }).click()
    await expect.poll(() => form.locator('.field-error').first().textContent()).toBe('lists the same hour twice')

    await reminders.fill('72, 24')
    await form.getByLabel('What to bring').fill('your insurance card and a mask')
    await form.getByLabel('The patient\'s cancel link').selectOption('cancel')
    await form.getByRole('button', { name: 'Save settings' }).click()
    await expect.poll(() => form.getByRole('status').textContent()).toMatch(/^Saved for Larkspur annex/)
    await screenshot(page, 'site-settings-saved')

    await page.reload()
    await page.getByTestId('site-rows').getByRole('button', { name }).click()
    await expect.poll(() => page.getByTestId('site-settings').getByLabel('Reminders, hours before the visit').inputValue()).toBe('72, 24')
    expect(await page.getByTestId('site-settings').getByLabel('What to bring').inputValue()).toBe('your insurance card and a mask')
    expect(await page.getByTestId('site-settings').getByLabel('The patient\'s cancel link').inputValue()).toBe('cancel')
  })
})

describe('People', () => {
  it('lists staff accounts, filtered by role, and the providers', async () => {
    const { page } = browser
    await page.goto('/people')
    const rows = page.getByTestId('staff-rows').locator('tr')
    await expect.poll(() => rows.count()).toBeGreaterThanOrEqual(14)
    await page.getByLabel('Only this role').selectOption('hygienist')
    await expect.poll(async () => new Set(await rows.locator('td:nth-child(3)').allTextContents())).toEqual(new Set(['Hygienist']))
    await expect.poll(() => page.getByTestId('provider-rows').locator('li').count()).toBeGreaterThanOrEqual(7)
    await screenshot(page, 'people-hygienists')
  })
})
