// Issue 14, the booking drawer and Openings, in real Chromium at 1440×900 and 1024×768: no red error
// before the user has done anything; the provider on shift first and chosen, off-shift providers last
// and marked; a note; warnings (not refusals) for a visit at another site less than an hour before and
// a children's procedure for an adult; a refused "Book this time" explained right under that button and
// announced (WCAG 2.2 §4.1.3); Openings grouped by gap with another start choosable, "Show more"; and
// after booking from Openings a notice saying who, when and where, with a jump to that day and the visit
// highlighted. Two test annexes of their own (tests/helpers/booking-fixtures.ts), any week.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { randomUUID } from 'node:crypto'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession, type Page } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt, type Annex } from '../helpers/booking-fixtures'
import { createStaff, STAFF_PASSWORD } from '../helpers/midday'
import { daysFromToday } from '../helpers/dates'
import { hashPasswordOutsideServer } from '../../db/password-hash'

let annex: Annex
let other: Annex
let desk: { email: string }
let offShiftName: string
let patient: { id: number; first: string; last: string }

beforeAll(async () => {
  annex = await createAnnex({ rooms: 2, providers: 1, patients: 3 })
  other = await createAnnex({ rooms: 1, providers: 1, patients: 0 })
  desk = await createStaff('front_desk', [annex.siteId, other.siteId])
  // A dentist of the annex with no shift at all: listed last and marked.
  const db = testDb()
  const tag = randomUUID().slice(0, 8)
  offShiftName = `Dr. Offshift ${tag}`
  const [userId] = await db('users').insert({ email: `test-offshift-${tag}@fernhollow.test`, name: offShiftName, role: 'dentist', password_hash: await hashPasswordOutsideServer('offshift-password') })
  await db('user_sites').insert({ user_id: userId, site_id: annex.siteId })
  await db('providers').insert({ user_id: userId, capabilities: '["restorative","exam"]' })
  // A name no other test uses, so the type-ahead finds exactly this patient.
  await db('patients').where({ id: annex.patientIds[0] }).update({ first_name: 'Wrenna', last_name: `Quillfeather${tag}` })
  patient = { id: annex.patientIds[0]!, first: 'Wrenna', last: `Quillfeather${tag}` }
})
afterAll(async () => { await closeTestDb() })

async function clickSlot(page: Page, column: number, date: string, time: string) {
  const lane = page.locator(`td.fc-timegrid-slot-lane[data-time="${time}:00"]`)
  await lane.scrollIntoViewIfNeeded()
  const col = await page.locator(`td.fc-timegrid-col[data-date]`).nth(column).boundingBox()
  const slot = await lane.boundingBox()
  expect(date).toBeTruthy()
  await page.mouse.click(col!.x + col!.width / 2, slot!.y + 3)
}

const cases = [
  { viewport: { width: 1440, height: 900 }, day: 7 },
  { viewport: { width: 1024, height: 768 }, day: 9 },
]

for (const { viewport, day } of cases) {
  const size = `${viewport.width}x${viewport.height}`
  describe(`the booking drawer at ${size}`, () => {
    let browser: BrowserSession
    const date = () => daysFromToday(day, annex.timeZone)
    beforeAll(async () => {
      browser = await openBrowser(inject('baseURL'), viewport)
      await signInThroughForm(browser.page, desk.email, STAFF_PASSWORD)
      await browser.page.waitForURL(/\/chairboard$/)
      // The desk has two sites: work at the first annex.
      await browser.page.getByTestId('site-switcher').selectOption(String(annex.siteId))
      await browser.page.locator('#board-date').fill(date())
      await browser.page.locator('td.fc-timegrid-col').first().waitFor()
      // The patient's visit at the other annex ends at 09:25, 35 minutes before the slot below.
      const admin = await signedInAs('admin@fernhollow.test')
      const elsewhere = await admin.post('/api/visits', {
        siteId: other.siteId, operatoryId: other.operatoryIds[0], providerId: other.providerIds[0], patientId: patient.id,
        items: [{ templateCode: 'EXAM-EMER' }], startUtc: utcAt(`${date()}T08:45`, other.timeZone),
      })
      expect(elsewhere.status, JSON.stringify(elsewhere.body)).toBe(201)
      // The next day, short visits every 90 minutes from 01:00 split the provider's time into gaps.
      for (const time of ['01:00', '02:30', '04:00', '05:30', '07:00', '08:30']) {
        const blocking = await admin.post('/api/visits', {
          siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[2],
          items: [{ templateCode: 'EXAM-EMER' }], startUtc: utcAt(`${daysFromToday(day + 1, annex.timeZone)}T${time}`, annex.timeZone),
        })
        expect(blocking.status, JSON.stringify(blocking.body)).toBe(201)
      }
    })
    afterAll(async () => { await browser?.close() })

    it('opens without a red error, with the provider on shift chosen and the one off shift last and marked', async () => {
      const { page } = browser
      await clickSlot(page, 0, date(), '10:00')
      const drawer = page.getByTestId('booking-drawer')
      await drawer.waitFor()
      expect(await drawer.locator('.field-error, [role="alert"]').filter({ hasText: /\S/ }).count()).toBe(0)
      const options = await drawer.getByTestId('slot-provider').locator('option').allTextContents()
      expect(options.at(-1)).toBe(`${offShiftName} (not on shift)`)
      expect(options[0]).not.toContain('not on shift')
      expect(await drawer.getByTestId('slot-provider').inputValue()).toBe(String(annex.providerIds[0]))
      await screenshot(page, `drawer-opened-${size}`)
    })

    it('warns of a visit at another site less than an hour before, and of a children\'s procedure for an adult', async () => {
      const { page } = browser
      const drawer = page.getByTestId('booking-drawer')
      await drawer.getByLabel('Search by name').fill(patient.last)
      await drawer.getByRole('option').filter({ hasText: patient.first }).first().getByRole('button').click()
      await drawer.getByLabel('Procedure', { exact: true }).selectOption('CLEAN-CHILD')
      const warnings = drawer.getByTestId('booking-warnings')
      await expect.poll(() => warnings.textContent()).toMatch(/ending 9:25 AM, less than an hour before/)
      expect(await warnings.textContent()).toMatch(/Child cleaning is a procedure for children, and the patient will be \d\d/)
      // A warning, not a refusal: the button stays usable.
      expect(await drawer.getByTestId('book-slot').isEnabled()).toBe(true)
      await screenshot(page, `drawer-warnings-${size}`)
      await drawer.getByLabel('Procedure', { exact: true }).selectOption('COMP-POST')
      await drawer.getByRole('button', { name: 'Tooth 19' }).click()
      await drawer.getByRole('button', { name: 'M', exact: true }).click()
      await drawer.getByRole('button', { name: 'O', exact: true }).click()
      await expect.poll(() => drawer.getByTestId('drawer-preview').isVisible()).toBe(true)
    })

    it('shows a refused "Book this time" right under the button, in plain words, and clears it once something changes', async () => {
      const { page } = browser
      const drawer = page.getByTestId('booking-drawer')
      // Someone else takes the chair at 10:00 meanwhile.
      const admin = await signedInAs('admin@fernhollow.test')
      const taken = await admin.post('/api/visits', {
        siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[1],
        items: FILLING, startUtc: utcAt(`${date()}T10:00`, annex.timeZone),
      })
      expect(taken.status, JSON.stringify(taken.body)).toBe(201)
      await drawer.getByTestId('book-slot').click()
      const message = drawer.getByTestId('drawer-message')
      await expect.poll(() => message.textContent()).toMatch(/\S/)
      expect(await message.textContent()).not.toMatch(/[a-z]+Id:|Utc:/)
      expect(await message.getAttribute('aria-live')).toBe('polite')
      const button = (await drawer.getByTestId('book-slot').boundingBox())!
      const box = (await message.boundingBox())!
      expect(box.y - (button.y + button.height)).toBeLessThan(40)
      await screenshot(page, `drawer-refused-${size}`)
      await drawer.getByLabel(/^Note/).fill('Prefers the window chair')
      await expect.poll(() => message.textContent()).toBe('')
    })

    it('groups openings by gap, lets another start be picked, pages further, and books with a note', async () => {
      const { page } = browser
      const drawer = page.getByTestId('booking-drawer')
      const next = daysFromToday(day + 1, annex.timeZone)
      await drawer.getByLabel('Procedure', { exact: true }).selectOption('EXAM-EMER')
      await drawer.getByLabel('From', { exact: true }).fill(next)
      await drawer.getByLabel('To', { exact: true }).fill(next)
      await drawer.getByLabel('Site', { exact: true }).selectOption(String(annex.siteId))
      await drawer.getByRole('button', { name: 'Find openings' }).click()
      const gaps = drawer.getByTestId('opening-gap')
      await expect.poll(() => gaps.count()).toBeGreaterThan(0)
      const shown = await gaps.count()
      // Distinct gaps: no two rows say the same chair, provider and window.
      const texts = await gaps.evaluateAll((rows) => rows.map((row) => row.querySelector('span')?.textContent?.trim()))
      expect(new Set(texts).size).toBe(texts.length)
      const first = gaps.first()
      const starts = await first.getByTestId('gap-start').locator('option').allTextContents()
      expect(starts.length).toBeGreaterThan(1)
      await drawer.getByTestId('openings-more').click()
      await expect.poll(() => gaps.count()).toBeGreaterThan(shown)
      await screenshot(page, `drawer-openings-${size}`)
      await first.getByTestId('gap-start').selectOption({ label: starts[1]! })
      await first.getByRole('button', { name: 'Book' }).click()
      await drawer.waitFor({ state: 'detached' })
      const notice = page.getByTestId('board-notice')
      await expect.poll(() => notice.textContent()).toContain(`Booked ${patient.first} ${patient.last}`)
      expect(await notice.textContent()).toContain(starts[1]!)
      expect(await notice.textContent()).toMatch(/Room \d at Test annex/)
      const visit = await testDb()('visits').where({ patient_id: patient.id, site_id: annex.siteId }).orderBy('id', 'desc').first('id', 'note')
      expect(visit.note).toBe('Prefers the window chair')
      await notice.getByTestId('notice-jump').click()
      await expect.poll(() => page.locator('#board-date').inputValue()).toBe(next)
      await expect.poll(() => page.locator(`[data-board-visit="${visit.id}"].is-highlighted`).count()).toBe(1)
      await page.getByTestId('visit-panel').waitFor()
      await screenshot(page, `drawer-jumped-${size}`)
      await page.keyboard.press('Escape')
    })
  })
}
