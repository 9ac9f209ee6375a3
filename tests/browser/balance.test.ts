// The Balance screen as a manager uses it, in real Chromium: every site with its chairs and
// providers, a visit booked just now counted in its chair, thresholds changed on the page.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'
import { FILLING, utcAt } from '../helpers/booking-fixtures'
import { weekdayAhead, plusDays, TUESDAY } from '../helpers/dates'

const DAY = weekdayAhead(11, TUESDAY, 'America/Los_Angeles') // a Tuesday: the demo dentist works at Quarry Street
let browser: BrowserSession

beforeAll(async () => {
  const manager = await signedInAs('manager@fernhollow.test')
  const quarry = await siteIdBySlug('quarry-street')
  const chair = await testDb()('operatories').where({ site_id: quarry }).orderBy('sort_order').first('id')
  const dentist = await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('users.email', 'dentist@fernhollow.test').first('providers.id')
  const patient = await testDb()('patients').orderBy('id').offset(170).first('id')
  const booked = await manager.post('/api/visits', { siteId: quarry, operatoryId: chair.id, providerId: dentist.id, patientId: patient.id, startUtc: utcAt(`${DAY}T09:00`, 'America/Los_Angeles'), items: FILLING })
  expect(booked.status).toBe(201)
  browser = await openBrowser(inject('baseURL'), { width: 1400, height: 1400 })
})
afterAll(async () => { await browser?.close(); await closeTestDb() })

describe('Balance', () => {
  it('shows each site\'s chairs and providers, counts a booked visit, and follows the thresholds', async () => {
    const { page } = browser
    await signInThroughForm(page, 'manager@fernhollow.test')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Balance' }).click()
    await page.waitForURL(/\/balance$/)
    await screenshot(page, 'balance-opened')
    await page.getByLabel('From', { exact: true }).fill(DAY)
    await page.getByLabel('To', { exact: true }).fill(DAY)
    const quarry = page.getByRole('article', { name: 'Fernhollow Quarry Street' })
    await quarry.waitFor()
    expect(await page.getByTestId('balance-site').count()).toBeGreaterThanOrEqual(3)
    const chair1 = quarry.getByTestId('balance-row').filter({ hasText: 'Chair 1' })
    // The filling holds Chair 1 for more than an hour of its open day, so its share is above 0 %.
    await expect.poll(async () => chair1.textContent()).toMatch(/Chair 1[\s\S]*h[\s\S]*[1-9]\d* %/)
    await expect.poll(async () => quarry.getByTestId('balance-row').filter({ hasText: 'Dr. ' }).count()).toBeGreaterThan(0)
    expect(await chair1.locator('[data-band]').getAttribute('data-band')).toBe('quiet')
    await screenshot(page, 'balance-manager')

    // A week shows the site's chairs day by day, Tuesday to the Monday after.
    await page.getByLabel('To', { exact: true }).fill(plusDays(DAY, 6))
    await expect.poll(() => quarry.getByTestId('balance-day').count()).toBe(7)
    expect(await quarry.getByTestId('balance-day').first().getAttribute('data-date')).toBe(DAY)
    await screenshot(page, 'balance-week')

    // With "quiet" below 0 % nothing is quiet any more: the same chair reads steady.
    await page.getByLabel('Quiet below %').fill('0')
    await expect.poll(async () => chair1.locator('[data-band]').getAttribute('data-band')).toBe('steady')

    // Nonsense is named on the page, in the page's own words, and the figures stay as they were.
    await page.getByLabel('Quiet below %').fill('95')
    await expect.poll(() => page.getByRole('alert').textContent()).toBe('"Quiet below" must be lower than "Tight from".')
    await page.getByLabel('Quiet below %').fill('0')
    await page.getByLabel('To', { exact: true }).fill(plusDays(DAY, -21))
    await expect.poll(() => page.getByRole('alert').textContent()).toBe('To must not be before from.')
  })
})
