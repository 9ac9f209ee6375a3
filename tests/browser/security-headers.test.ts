// The Content-Security-Policy does not get in the app's way: no violation on the Chairboard (FullCalendar
// injects its own styles) or on the patient's visit page, and both still render styled with the app's fonts.
// Violations are what the browser reports (CSP Level 3 §5.3 "securitypolicyviolation" events, and its
// console messages); an init script added through the DevTools protocol collects them.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import type { Page } from 'playwright-core'
import { signedInAs } from '../helpers/api-client'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { closeTestDb, createTestUser, testDb } from '../helpers/db'
import { createAnnex, utcAt } from '../helpers/booking-fixtures'
import { bookingFor } from '../helpers/mail-fixtures'
import { TUESDAY, WEDNESDAY, weekdayAhead } from '../helpers/dates'
import { signVisitToken } from '../../server/utils/visit-token'

let browser: BrowserSession
const consoleViolations: string[] = []

beforeAll(async () => {
  browser = await openBrowser(inject('baseURL'), { width: 1400, height: 1100 })
  await browser.context.addInitScript(() => {
    const seen: string[] = []
    ;(window as unknown as { __cspViolations: string[] }).__cspViolations = seen
    document.addEventListener('securitypolicyviolation', (event) => {
      seen.push(`${event.effectiveDirective} blocked ${event.blockedURI || '(inline)'} at ${event.sourceFile}:${event.lineNumber}`)
    })
  })
  browser.page.on('console', (message) => {
    if (/Content Security Policy|Refused to (load|execute|apply|connect|frame)/i.test(message.text())) consoleViolations.push(message.text())
  })
})

afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

async function violationsOn(page: Page): Promise<string[]> {
  return page.evaluate(() => (window as unknown as { __cspViolations?: string[] }).__cspViolations ?? ['(collector missing)'])
}

/** The app's own font (shipped with it, @fontsource/inter) really loaded, and Tailwind's styles applied. */
async function expectStyled(page: Page) {
  const fonts = await page.evaluate(async () => {
    await document.fonts.ready
    return { inter: document.fonts.check('16px Inter'), family: getComputedStyle(document.body).fontFamily }
  })
  expect(fonts.family).toMatch(/Inter/)
  expect(fonts.inter).toBe(true)
}

describe('Content-Security-Policy in the browser', () => {
  it('raises no violation on the Chairboard with a visit on it, and FullCalendar is styled', async () => {
    // A test site of its own with its own front desk, so the visit shown clashes with no other test.
    const annex = await createAnnex({ rooms: 2, patients: 1, timeZone: 'America/Los_Angeles' })
    const slug = (await testDb()('sites').where({ id: annex.siteId }).first('slug')).slug as string
    const desk = await createTestUser({ role: 'front_desk', siteSlugs: [slug] })
    const day = weekdayAhead(2, TUESDAY, annex.timeZone)
    const manager = await signedInAs('manager@fernhollow.test')
    expect((await manager.post('/api/visits', bookingFor(annex, 0, utcAt(`${day}T09:00`, annex.timeZone)))).status).toBe(201)

    const { page } = browser
    await signInThroughForm(page, desk.email, desk.password)
    await page.waitForURL(/\/chairboard$/)
    await page.locator('#board-date').fill(day)
    await page.getByTestId('visit-block').first().waitFor()
    // FullCalendar's stylesheet is injected at run time as a <style> element: .fc is a flex column.
    expect(await page.locator('.fc').first().evaluate((element) => getComputedStyle(element).display)).toBe('flex')
    await expectStyled(page)
    await screenshot(page, 'csp-chairboard')
    expect(await violationsOn(page)).toEqual([])
    expect(consoleViolations).toEqual([])
  })

  it('raises no violation on the patient\'s visit page, and confirming from it works', async () => {
    const annex = await createAnnex({ rooms: 1, patients: 1, timeZone: 'America/Denver' })
    const manager = await signedInAs('manager@fernhollow.test')
    const startUtc = utcAt(`${weekdayAhead(3, WEDNESDAY, annex.timeZone)}T10:00`, annex.timeZone)
    const booked = await manager.post('/api/visits', bookingFor(annex, 0, startUtc))
    expect(booked.status).toBe(201)
    const row = await testDb()('visits').where({ id: booked.body.id }).first('ical_uid')
    const token = signVisitToken(process.env.NUXT_MAIL_LINK_SECRET!, { id: booked.body.id, icalUid: row.ical_uid, expiresAtMs: new Date(startUtc).getTime() + 86_400_000 })

    const page = await browser.context.newPage()
    page.on('console', (message) => {
      if (/Content Security Policy|Refused to (load|execute|apply|connect|frame)/i.test(message.text())) consoleViolations.push(message.text())
    })
    await page.goto(`/visit/${encodeURIComponent(token)}`)
    await page.getByRole('heading', { name: 'Your dental visit' }).first().waitFor()
    await expectStyled(page)
    // The page's own POST (same origin, Referrer-Policy same-origin) still passes the origin check.
    await page.getByRole('button', { name: 'I will be there' }).click()
    await page.getByText('You have confirmed this visit. Thank you.').waitFor()
    expect((await testDb()('visits').where({ id: booked.body.id }).first('state')).state).toBe('confirmed')
    await screenshot(page, 'csp-visit-page')
    // The test site has no address or phone: the page leaves those rows out instead of showing blanks.
    const text = await page.getByTestId('visit-page').textContent()
    expect(text).not.toContain('call us at .')
    expect(text).toContain('To change the time, please contact the practice.')
    expect(await violationsOn(page)).toEqual([])
    expect(consoleViolations).toEqual([])
    await page.close()
  })
})
