// The week views in real Chromium: the demo dentist's week across sites, and one chair's week,
// each showing a visit booked next week through the API.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { DateTime } from 'luxon'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'
import { bookFirstOpening, demoDentistProviderId } from '../helpers/visits'
import { formatLocalDate, weekLabelOf } from '../../shared/utils/display-time'

const ZONE = 'America/Los_Angeles'
let browser: BrowserSession
let booking: Awaited<ReturnType<typeof bookFirstOpening>>
let chairName: string
let quarry: number

beforeAll(async () => {
  quarry = await siteIdBySlug('quarry-street')
  // Next week, Monday to Friday at Quarry Street: the dentist works there Mondays, Tuesdays and Thursdays.
  const nextMonday = DateTime.now().setZone(ZONE).startOf('week').plus({ weeks: 1 })
  booking = await bookFirstOpening(await signedInAs('desk.quarry@fernhollow.test'), {
    siteId: quarry, providerId: await demoDentistProviderId(), from: nextMonday.toISODate()!, to: nextMonday.plus({ days: 4 }).toISODate()!, patientOffset: 142,
  })
  chairName = booking.opening.operatoryName
  browser = await openBrowser(inject('baseURL'))
})
afterAll(async () => {
  await browser?.close()
  if (booking) {
    await testDb()('visit_segments').where({ visit_id: booking.visit.id }).delete()
    await testDb()('visits').where({ id: booking.visit.id }).update({ state: 'cancelled', cancel_reason: 'Week test' })
  }
  await closeTestDb()
})

const startLabel = () => DateTime.fromISO(booking.visit.startUtc).setZone(ZONE)

describe('Week views', () => {
  it('shows the dentist their own week across sites, with the visit on its local day and time', async () => {
    const { page } = browser
    await signInThroughForm(page, 'dentist@fernhollow.test')
    await page.waitForURL(/\/my-day$/)
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Week' }).click()
    await page.waitForURL(/\/week\/provider$/)
    await expect.poll(() => page.getByLabel('Provider to show').locator('option:checked').textContent()).toBe(booking.opening.providerName)
    await page.getByRole('button', { name: 'Next week' }).click()
    const start = startLabel()
    // Labels in the date order the demo sites use (read from the site row, not assumed).
    const { date_order: dateOrder } = await testDb()('sites').where({ slug: 'quarry-street' }).first('date_order')
    await expect.poll(() => page.getByTestId('week-label').textContent()).toBe(weekLabelOf(start.startOf('week').toISODate()!, { dateOrder }))
    const card = page.locator(`[data-testid="week-visit"][data-visit-id="${booking.visit.id}"]`)
    await expect.poll(() => card.count()).toBe(1)
    const day = page.getByRole('group', { name: formatLocalDate(start.toISODate()!, { dateOrder }, 'short') })
    expect(await day.locator(`[data-visit-id="${booking.visit.id}"]`).count()).toBe(1)
    const label = await card.getAttribute('aria-label')
    expect(label).toContain(booking.patientName)
    expect(label).toContain(`${start.toFormat('h:mm a')}–`)
    expect(label).toContain('Quarry Street')
    expect(await card.locator('[data-kind="numbing"]').count()).toBe(1)
    await screenshot(page, 'week-provider')
  })

  it('shows the same visit on its chair’s week for a manager at Quarry Street', async () => {
    const { page } = browser
    await page.context().clearCookies()
    await signInThroughForm(page, 'manager@fernhollow.test')
    await page.waitForURL(/\/chairboard$/)
    await page.getByTestId('site-switcher').selectOption(String(quarry))
    await page.goto('/week/operatory')
    await page.getByLabel('Chair to show').selectOption({ label: chairName })
    await page.getByRole('button', { name: 'Next week' }).click()
    await expect.poll(() => page.getByText(new RegExp(`^${chairName} at Fernhollow Quarry Street · times in Pacific time, UTC−[78]$`)).count()).toBe(1)
    const card = page.locator(`[data-testid="week-visit"][data-visit-id="${booking.visit.id}"]`)
    await expect.poll(() => card.count()).toBe(1)
    const label = await card.getAttribute('aria-label')
    expect(label).toContain(booking.patientName)
    expect(label).toContain(booking.opening.providerName)
    expect(label).toContain(`${startLabel().toFormat('h:mm a')}–`)
    await screenshot(page, 'week-operatory')
  })
})
