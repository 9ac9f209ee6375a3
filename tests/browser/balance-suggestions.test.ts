// Balance that suggests (issue 17 §3) in real Chromium, at 1440×900 and 1024×768: a quiet day at a
// test annex shows its waiting patient as a suggestion with the chair-use chart and its table; the
// offer goes out from the suggestion; the rota suggestion is previewed in the impact dialog and not
// saved; "Book in the drawer" opens the Chairboard's drawer with the patient chosen. axe-core with the
// WCAG 2.2 A/AA tags finds nothing unlisted on the page (WCAG 2.2, W3C Recommendation).
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { runAxe, unlisted, type AllowedViolation } from '../helpers/axe'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt, type Annex } from '../helpers/booking-fixtures'
import { weekdayAhead, FRIDAY } from '../helpers/dates'

const ALLOWED = JSON.parse(readFileSync(join(process.cwd(), 'tests', 'browser', 'axe-allow-list.json'), 'utf8')) as AllowedViolation[]
let quiet: Annex
let tight: Annex
let day: string
let patientName: string
let quietName: string

beforeAll(async () => {
  const manager = await signedInAs('manager@fernhollow.test')
  quiet = await createAnnex({ rooms: 1, providers: 1, patients: 2 })
  tight = await createAnnex({ rooms: 1, providers: 1, patients: 1 })
  day = weekdayAhead(10, FRIDAY, quiet.timeZone)
  const db = testDb()
  await db('patients').where({ id: quiet.patientIds[0] }).update({ email: 'balance.waiting@example.test', email_consent: true })
  const patient = await db('patients').where({ id: quiet.patientIds[0] }).first('first_name', 'last_name')
  patientName = `${patient.first_name} ${patient.last_name}`
  quietName = (await db('sites').where({ id: quiet.siteId }).first('name')).name
  const entry = await manager.post('/api/waitlist', { patientId: quiet.patientIds[0], siteId: quiet.siteId, items: FILLING, from: day, to: day, noticeMinutes: 0 })
  expect(entry.status).toBe(201)
  // The tight annex holds one visit that day; the quiet annex's dentist works there too.
  const booked = await manager.post('/api/visits', { siteId: tight.siteId, operatoryId: tight.operatoryIds[0], providerId: tight.providerIds[0], patientId: tight.patientIds[0], startUtc: utcAt(`${day}T10:00`, tight.timeZone), items: FILLING })
  expect(booked.status).toBe(201)
  const dentist = await db('providers').where({ id: quiet.providerIds[0] }).first('user_id')
  await db('user_sites').insert({ user_id: dentist.user_id, site_id: tight.siteId })
})
afterAll(closeTestDb)

async function openQuietDay(browser: BrowserSession) {
  const { page } = browser
  await signInThroughForm(page, 'manager@fernhollow.test')
  await page.waitForURL((url) => !url.pathname.startsWith('/sign-in'))
  return showQuietDay(browser)
}

async function showQuietDay(browser: BrowserSession) {
  const { page } = browser
  await page.goto('/balance')
  await page.getByLabel('From', { exact: true }).fill(day)
  await page.getByLabel('To', { exact: true }).fill(day)
  // The annexes are open around the clock: one filling is about 4 % of a day, so these make it tight.
  await page.getByLabel('Tight from %').fill('3')
  await page.getByLabel('Quiet below %').fill('2')
  const suggestion = page.getByTestId('balance-suggestion').filter({ hasText: patientName })
  await suggestion.waitFor({ timeout: 30_000 })
  return suggestion
}

for (const viewport of [{ width: 1440, height: 900 }, { width: 1024, height: 768 }]) {
  describe(`Balance suggestions at ${viewport.width}×${viewport.height}`, () => {
    let browser: BrowserSession
    beforeAll(async () => { browser = await openBrowser(inject('baseURL'), viewport) })
    afterAll(async () => { await browser?.close() })

    it('shows the waiting patient as a suggestion beside the chair-use chart, and its table', async () => {
      const { page } = browser
      const suggestion = await openQuietDay(browser)
      expect(await suggestion.getAttribute('data-kind')).toBe('waitlist_fit')
      expect(await suggestion.textContent()).toContain('COMP-POST')
      const chart = page.getByTestId('balance-chart')
      await expect.poll(() => chart.locator('canvas').count()).toBe(1)
      expect(await chart.locator('canvas').getAttribute('role')).toBe('img')
      await chart.getByText('The same figures as a table').click()
      const row = page.getByTestId('balance-chart-table').getByRole('row').filter({ hasText: `Test annex` }).first()
      await expect.poll(() => row.textContent()).toMatch(/\d+ %/)
      await page.getByTestId('balance-chart').scrollIntoViewIfNeeded()
      await screenshot(page, `balance-suggestions-${viewport.width}`)
      expect(unlisted(await runAxe(page), '/balance', ALLOWED)).toEqual([])
    })

    it('previews the rota day off in the impact dialog and saves nothing when cancelled', async () => {
      const { page } = browser
      const rota = page.getByTestId('balance-suggestion').filter({ hasText: 'works at both' }).filter({ hasText: quietName }).first()
      await rota.getByTestId('suggestion-preview-rota').click()
      const dialog = page.getByTestId('impact-dialog')
      await dialog.waitFor()
      expect(await dialog.textContent()).toContain('No booked visit would lose them')
      expect(await rota.textContent()).toContain('(all day)')
      await screenshot(page, `balance-rota-preview-${viewport.width}`)
      await dialog.getByRole('button', { name: 'Cancel the change' }).click()
      await expect.poll(() => rota.getByTestId('suggestion-outcome').textContent()).toBe('Nothing changed.')
      expect(await testDb()('shift_exceptions').where({ provider_id: quiet.providerIds[0], start_date: day }).count({ n: '*' }).first()).toEqual({ n: 0 })
    })

    it(viewport.width === 1440 ? 'sends the offer from the suggestion' : 'books the waiting patient in the Chairboard drawer', async () => {
      const { page } = browser
      const suggestion = page.getByTestId('balance-suggestion').filter({ hasText: patientName })
      if (viewport.width === 1440) {
        await suggestion.getByRole('button', { name: 'Send an offer' }).click()
        expect(await suggestion.getByTestId('offer-channels').textContent()).toBe('by e-mail')
        await expect.poll(() => suggestion.getByTestId('suggestion-outcome').textContent()).toMatch(/^Offer sent to .+ by e-mail; open until /)
        await screenshot(page, 'balance-offer-sent')
      } else {
        await suggestion.getByRole('button', { name: 'Book in the drawer' }).click()
        await page.waitForURL(/\/chairboard/)
        const drawer = page.getByTestId('booking-drawer')
        await expect.poll(() => drawer.textContent(), { timeout: 15_000 }).toContain(patientName)
        // The suggested chair and time are the drawer's slot.
        await expect.poll(() => drawer.getByRole('region', { name: 'Clicked slot' }).textContent()).toContain('Room 1')
        await screenshot(page, 'balance-book-drawer')
      }
    })

    it.runIf(viewport.width === 1024)('saves the day off, then the extra day at the tight site, each asked before it is written', async () => {
      const { page } = browser
      await showQuietDay(browser)
      const rota = page.getByTestId('balance-suggestion').filter({ hasText: 'works at both' }).filter({ hasText: quietName }).first()
      await rota.getByTestId('suggestion-preview-rota').click()
      await page.getByTestId('impact-dialog').getByTestId('impact-confirm').click()
      await expect.poll(() => rota.getByTestId('suggestion-outcome').textContent()).toMatch(/^Day off saved\. Next: the extra day at /)
      await rota.getByTestId('suggestion-extra-day').click()
      const dialog = page.getByTestId('impact-dialog')
      await dialog.waitFor()
      expect(await dialog.textContent()).toContain('(all day)?')
      await screenshot(page, 'balance-rota-extra-day')
      await dialog.getByTestId('impact-confirm').click()
      await expect.poll(async () => (await testDb()('shift_exceptions').where({ provider_id: quiet.providerIds[0], start_date: day }).select('kind', 'site_id')).map((row) => `${row.kind}@${row.site_id}`).sort())
        .toEqual([`extra@${tight.siteId}`, `time_off@${quiet.siteId}`])
    })
  })
}

