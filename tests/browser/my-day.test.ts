// My day as the demo dentist sees it, in real Chromium: a filling booked on a fixed day ahead,
// its numbing band, no countdown while the patient has not arrived (issue 13 §4), and a state change the server refuses rolled back with its reason.
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { ARTIFACTS, openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, siteIdBySlug, testDb } from '../helpers/db'
import { bookFirstOpening, demoDentistProviderId } from '../helpers/visits'
import { weekdayAhead, MONDAY, WEDNESDAY } from '../helpers/dates'
import { formatDate } from '../../shared/utils/display-time'

const ZONE = 'America/Los_Angeles'
const VISIT_DAY = weekdayAhead(13, MONDAY, 'America/Los_Angeles')
let browser: BrowserSession
let booking: Awaited<ReturnType<typeof bookFirstOpening>>

beforeAll(async () => {
  const quarry = await siteIdBySlug('quarry-street')
  const dentist = await demoDentistProviderId()
  // A Monday 13 weeks ahead, when the demo dentist works at Quarry Street: the browser's clock is set to
  // that visit below, so the test does not depend on the hour it runs at.
  booking = await bookFirstOpening(await signedInAs('desk.quarry@fernhollow.test'), {
    siteId: quarry, providerId: dentist, from: VISIT_DAY, to: VISIT_DAY, patientOffset: 141, note: 'Prefers the left side of the chair',
  })
  browser = await openBrowser(inject('baseURL'))
})
afterAll(async () => {
  await browser?.close()
  // Give the chair and the dentist back, so later tests find today as it was.
  if (booking) {
    await testDb()('visit_segments').where({ visit_id: booking.visit.id }).delete()
    await testDb()('visits').where({ id: booking.visit.id }).update({ state: 'cancelled', cancel_reason: 'My day test' })
  }
  await closeTestDb()
})

describe('My day', () => {
  it('shows the dentist the visit with its numbing band, no running clock before arrival, and offers arriving on its day', async () => {
    const { page } = browser
    const numbing = booking.visit.segments.find((segment: { kind: string }) => segment.kind === 'numbing')
    expect(numbing, 'a two-surface filling on 19 waits for the anaesthetic').toBeTruthy()
    // The browser's clock is set to half a minute into the numbing wait.
    await page.clock.install({ time: new Date(Date.parse(numbing.startUtc) + 30_000) })

    await signInThroughForm(page, 'dentist@fernhollow.test')
    await page.waitForURL(/\/my-day$/)
    await expect.poll(() => page.getByTestId('myday-site').textContent()).toContain('Fernhollow Quarry Street · times in Pacific time, UTC\u2212')
    const block = page.locator(`[data-testid="myday-visit"][data-visit-id="${booking.visit.id}"]`)
    await expect.poll(() => block.count()).toBe(1)
    expect(await block.textContent()).toContain(booking.patientName)
    expect(await block.textContent()).toContain('Posterior composite 19 MO')
    expect(await block.locator('[data-kind="numbing"]').count()).toBeGreaterThan(0)
    expect(await block.locator('[data-kind="hands_on"]').count()).toBeGreaterThan(0)
    expect(await block.getByTestId('visit-state').getAttribute('data-state')).toBe('booked')

    // Inside the planned numbing time, but the patient has not arrived: no clock, no onset words
    // (the countdown runs from "anaesthetic given": tests/browser/undo-and-numbing.test.ts).
    expect(await block.getByTestId('numbing-countdown').count()).toBe(0)
    expect(await block.getByTestId('numbing-planned').count()).toBe(0)
    const numbingPanel = page.getByTestId('numbing-now')
    expect(await numbingPanel.textContent()).not.toContain(booking.patientName)

    // Next up lists tooth, surfaces and the note.
    const next = page.getByTestId('next-up-item').filter({ hasText: booking.patientName })
    expect(await next.textContent()).toMatch(/tooth 19 · surfaces MO/)
    expect(await next.textContent()).toContain('Prefers the left side of the chair')

    // On its day (the browser's clock), arriving is offered; moving it along is tested on a visit booked
    // today in tests/browser/visit-rules.test.ts, since the server's clock is the real one.
    expect(await block.getByRole('button', { name: `Mark arrived: ${booking.patientName}` }).isEnabled()).toBe(true)
    expect(await page.getByText('On shift ').count()).toBe(1)
    await screenshot(page, 'my-day-dentist')
    await block.screenshot({ path: join(ARTIFACTS, 'my-day-visit-block.png') })
  })

  it('rolls a refused state change back and says why', async () => {
    const { page } = browser
    const block = page.locator(`[data-testid="myday-visit"][data-visit-id="${booking.visit.id}"]`)
    // Only this browser's clock reads the visit's day; the server's clock is today's, so it refuses.
    // The refusal names the day in the site's own date order (its setting on the site row).
    const site = await testDb()('sites').where({ slug: 'quarry-street' }).first('clock', 'date_order')
    const day = formatDate(booking.visit.startUtc, { timeZone: ZONE, clock: site.clock, dateOrder: site.date_order })
    await block.getByRole('button', { name: `Mark arrived: ${booking.patientName}` }).click()
    await expect.poll(() => page.getByTestId('state-problem').textContent())
      .toBe(`Could not mark ${booking.patientName} as arrived: ${day} is not today: a visit can be marked arrived only on its day.`)
    expect(await block.getByTestId('visit-state').getAttribute('data-state')).toBe('booked')
    expect((await testDb()('visits').where({ id: booking.visit.id }).first('state')).state).toBe('booked')
    await screenshot(page, 'my-day-refused')
  })

  it('opens a Wednesday at Saguaro Flats, where the dentist works that day, in Phoenix time', async () => {
    const { page } = browser
    const wednesday = weekdayAhead(1, WEDNESDAY, 'America/Phoenix')
    await page.getByLabel('Day to show').fill(wednesday)
    await page.waitForURL(new RegExp(`/my-day\\?date=${wednesday}$`))
    await expect.poll(() => page.getByTestId('myday-site').textContent()).toBe('Fernhollow Saguaro Flats · times in Mountain time, UTC\u22127')
    expect(await page.getByTestId('myday-empty').textContent()).toContain('No visits booked for you at Fernhollow Saguaro Flats')
    expect(await page.getByText('On shift 7:00 AM–3:00 PM').count()).toBe(1)
    // The same day straight from its address (rendered on the server first).
    await page.reload()
    await expect.poll(() => page.getByText('On shift 7:00 AM–3:00 PM').count()).toBe(1)
    expect(await page.getByTestId('myday-site').textContent()).toBe('Fernhollow Saguaro Flats · times in Mountain time, UTC\u22127')
  })
})
