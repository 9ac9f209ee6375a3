// The day sheet (issue 14): the Chairboard's day as printed, in real Chromium. On a private annex
// (around-the-clock hours, two rooms): a 15-minute visit and a filling. The printed sheet has the
// date, the site and its zone, who is on shift, a legend, every visit in full with the patient's
// phone, and it is laid out on A4 and on US Letter (the PDFs are turned into PNGs to look at).
import { execFileSync } from 'node:child_process'
import { existsSync, mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { DateTime } from 'luxon'
import { ARTIFACTS, openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { FILLING, utcAt } from '../helpers/booking-fixtures'
import { weekdayAhead, THURSDAY } from '../helpers/dates'

let browser: BrowserSession
let annex: MailAnnex
let day: string
const PHONES = ['(209) 555-0163', '(209) 555-0164']

beforeAll(async () => {
  annex = await createMailAnnex({ patients: 2, mailLane: 'day-sheet' })
  day = weekdayAhead(3, THURSDAY, annex.timeZone)
  for (const [index, phone] of PHONES.entries()) await testDb()('patients').where({ id: annex.patientIds[index] }).update({ phone })
  const manager = await signedInAs('manager@fernhollow.test')
  const short = await manager.post('/api/visits', { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[0], startUtc: utcAt(`${day}T09:00`, annex.timeZone), items: [{ templateCode: 'EXAM-EMER' }], note: 'Call before noon' })
  expect(short.status).toBe(201)
  const filling = await manager.post('/api/visits', { siteId: annex.siteId, operatoryId: annex.operatoryIds[1], providerId: annex.providerIds[0], patientId: annex.patientIds[1], startUtc: utcAt(`${day}T10:00`, annex.timeZone), items: FILLING })
  expect(filling.status).toBe(201)
  browser = await openBrowser(inject('baseURL'), { width: 1440, height: 900 })
  await signInThroughForm(browser.page, 'manager@fernhollow.test')
  await browser.page.waitForURL((url) => url.pathname !== '/sign-in')
})
afterAll(async () => { await browser?.close(); await closeTestDb() })

describe('day sheet', () => {
  for (const viewport of [{ width: 1440, height: 900 }, { width: 1024, height: 768 }]) {
    it(`prints the day in full at ${viewport.width}×${viewport.height}: date, site, zone, shift, legend, every visit with the phone`, async () => {
      const { page } = browser
      await page.emulateMedia({ media: 'screen' })
      await page.setViewportSize(viewport)
      // A link naming the site and the day (as Balance gives) opens that day at that site.
      await page.goto(`/chairboard?site=${annex.siteId}&date=${day}`)
      await page.locator('.fc-col-header-cell').first().waitFor()
      expect(await page.getByTestId('day-sheet').isVisible()).toBe(false)
      await page.emulateMedia({ media: 'print' })
      const sheet = page.getByTestId('day-sheet')
      await expect.poll(() => sheet.isVisible()).toBe(true)
      expect(await page.locator('.fc').isVisible()).toBe(false)
      const siteName = (await testDb()('sites').where({ id: annex.siteId }).first()).name
      expect(await page.getByTestId('day-sheet-title').textContent()).toBe(`Day sheet · ${siteName}`)
      // The annex keeps the default style: month-day-year, 12-hour clock.
      expect(await page.getByTestId('day-sheet-date').textContent()).toBe(DateTime.fromISO(day).setLocale('en-US').toFormat('cccc, LLLL d, yyyy'))
      expect(await sheet.textContent()).toMatch(/Times in Pacific time, UTC−[78]/)
      expect(await page.getByTestId('day-sheet-shift').textContent()).toMatch(/On shift: Dr\. Annex .+ 12:00 AM–12:00 AM/)
      expect(await page.getByTestId('day-sheet-legend').textContent()).toContain('Numbing wait')
      const rows = page.getByTestId('day-sheet-visit')
      expect(await rows.count()).toBe(2)
      const first = await rows.nth(0).textContent()
      expect(first).toContain('9:00 AM–9:')
      expect(first).toContain(PHONES[0])
      expect(first).toContain('Call before noon')
      expect(await rows.nth(1).textContent()).toContain(PHONES[1])
      // The short visit's row is as tall as its text needs, never clipped.
      const box = await rows.nth(0).boundingBox()
      expect(box!.height).toBeGreaterThan(10)
      expect(await rows.nth(0).evaluate((row) => row.scrollHeight <= row.clientHeight + 1)).toBe(true)
      await screenshot(page, `day-sheet-print-${viewport.width}`)
      await page.emulateMedia({ media: 'screen' })
    })
  }

  it('lays the sheet out on A4 and on US Letter', async () => {
    const { page } = browser
    await page.goto(`/chairboard?site=${annex.siteId}&date=${day}`)
    await page.locator('.fc-col-header-cell').first().waitFor()
    mkdirSync(ARTIFACTS, { recursive: true })
    await page.emulateMedia({ media: 'print' })
    await expect.poll(() => page.getByTestId('day-sheet').isVisible()).toBe(true)
    for (const format of ['A4', 'Letter'] as const) {
      const pdf = await page.pdf({ format, printBackground: true })
      const path = join(ARTIFACTS, `day-sheet-${format}.pdf`)
      writeFileSync(path, pdf)
      // ISO 216 A4 is 210×297 mm, about 595×842 pt; US Letter 8.5×11 in, 612×792 pt (1 pt = 1/72 in).
      // Chromium rounds A4 to whole hundredths of an inch, so within a point.
      const box = /\/MediaBox \[0 0 ([\d.]+) ([\d.]+)\]/.exec(pdf.toString('latin1'))
      const [width, height] = format === 'A4' ? [595.3, 841.9] : [612, 792]
      expect(Math.abs(Number(box![1]) - width)).toBeLessThan(1.5)
      expect(Math.abs(Number(box![2]) - height)).toBeLessThan(1.5)
      if (existsSync('/usr/bin/pdftoppm')) execFileSync('/usr/bin/pdftoppm', ['-png', '-r', '60', '-f', '1', '-l', '1', path, join(ARTIFACTS, `day-sheet-${format}`)])
    }
  })
})
