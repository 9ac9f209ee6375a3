// Balance that suggests (issue 17 §3) in real Chromium, at 1440×900 and 1024×768: a quiet day at a
// test annex shows its waiting patient as a suggestion with the chair-use chart and its table; the
// offer goes out from the suggestion; the rota move is previewed as a whole (day off and extra day)
// in the impact dialog, saved nothing when cancelled and both changes at once when confirmed; "Book
// in the drawer" opens the Chairboard's drawer with the patient chosen; a consolidate suggestion's
// "Send move offer", once confirmed, sends the patient the offer, which arrives at the mail catcher.
// axe-core with the WCAG 2.2 A/AA tags finds nothing unlisted on the page (WCAG 2.2, W3C Recommendation).
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { runAxe, unlisted, type AllowedViolation } from '../helpers/axe'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt, type Annex } from '../helpers/booking-fixtures'
import { createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { waitForOutboxMail } from '../helpers/mail'
import { weekdayAhead, FRIDAY } from '../helpers/dates'

const ALLOWED = JSON.parse(readFileSync(join(process.cwd(), 'tests', 'browser', 'axe-allow-list.json'), 'utf8')) as AllowedViolation[]
let quiet: Annex
let tight: Annex
let day: string
let patientName: string
let quietName: string
let tidy: MailAnnex
/** Per chair of the tidy annex: the visit between two half-hour stretches, and its patient's name. */
const middles: Array<{ visitId: number; patientName: string; email: string }> = []

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
  // A third annex that e-mails its patients: in each chair that day, a visit between two half-hour
  // stretches (too short to book alone), so Balance suggests moving it to join them.
  tidy = await createMailAnnex({ patients: 6, providers: 2 })
  for (const [room, operatoryId] of tidy.operatoryIds.entries()) {
    let startUtc = utcAt(`${day}T09:00`, tidy.timeZone)
    for (let index = 0; index < 3; index += 1) {
      const patientIndex = room * 3 + index
      const visit = await manager.post('/api/visits', { siteId: tidy.siteId, operatoryId, providerId: tidy.providerIds[room], patientId: tidy.patientIds[patientIndex], startUtc, items: FILLING })
      expect(visit.status, JSON.stringify(visit.body)).toBe(201)
      if (index === 1) {
        const patient = await db('patients').where({ id: tidy.patientIds[patientIndex] }).first('first_name', 'last_name')
        middles.push({ visitId: visit.body.id, patientName: `${patient.first_name} ${patient.last_name}`, email: tidy.emails[patientIndex]! })
      }
      startUtc = new Date(Date.parse(visit.body.endUtc) + 30 * 60_000).toISOString()
    }
  }
}, 60_000)
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
      // This test's own annex: other tests' annexes (some with nobody on shift) may sort before it.
      const row = page.getByTestId('balance-chart-table').getByRole('row').filter({ hasText: quietName }).first()
      await expect.poll(() => row.textContent()).toMatch(/\d+ %/)
      await page.getByTestId('balance-chart').scrollIntoViewIfNeeded()
      await screenshot(page, `balance-suggestions-${viewport.width}`)
      expect(unlisted(await runAxe(page), '/balance', ALLOWED)).toEqual([])
    })

    it('previews the whole rota move in the impact dialog and saves nothing when cancelled', async () => {
      const { page } = browser
      const rota = page.getByTestId('balance-suggestion').filter({ hasText: 'works at both' }).filter({ hasText: quietName }).first()
      expect(await rota.textContent()).toContain('(all day)')
      await rota.getByTestId('suggestion-move-rota').click()
      const dialog = page.getByTestId('impact-dialog')
      await dialog.waitFor()
      // One preview of both halves: the day off here and the extra day there, and what the move strands.
      const details = await dialog.getByTestId('impact-details').textContent()
      expect(details).toContain(`Day off at ${quietName}`)
      expect(details).toMatch(/Extra day at Test annex .*: all day on its clock/)
      expect(await dialog.getByTestId('impact-heading').textContent()).toMatch(/^No booked visit would lose /)
      await screenshot(page, `balance-rota-preview-${viewport.width}`)
      expect(unlisted(await runAxe(page), '/balance (rota move dialog)', ALLOWED)).toEqual([])
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

    it('sends a move offer from a consolidate suggestion once confirmed; the e-mail arrives', async () => {
      const { page } = browser
      await showQuietDay(browser)
      const middle = middles[viewport.width === 1440 ? 0 : 1]!
      const suggestion = page.getByTestId('balance-suggestion').filter({ hasText: middle.patientName })
      await suggestion.waitFor({ timeout: 30_000 })
      expect(await suggestion.getAttribute('data-kind')).toBe('consolidate')
      await suggestion.getByTestId('suggestion-move-offer').click()
      const dialog = page.getByTestId('impact-dialog')
      await dialog.waitFor()
      expect(await dialog.textContent()).toContain('The visit stays where it is unless they accept.')
      await screenshot(page, `balance-move-offer-confirm-${viewport.width}`)
      await dialog.getByTestId('impact-confirm').click()
      await expect.poll(() => suggestion.getByTestId('suggestion-outcome').textContent(), { timeout: 15_000 }).toMatch(new RegExp(`^Move offer sent to ${middle.patientName} by (e-mail|e-mail and text)`))
      await screenshot(page, `balance-move-offer-sent-${viewport.width}`)
      const row = await testDb()('outbox').where({ kind: 'move_offer', visit_id: middle.visitId, channel: 'email' }).first('id')
      const mail = await waitForOutboxMail(middle.email, row.id)
      expect(mail.parsed.text ?? '').toMatch(/See both times and answer: \S+/)
    })

    it.runIf(viewport.width === 1024)('moves the rota day in one step: one preview, one confirmation, both changes saved', async () => {
      const { page } = browser
      const rota = page.getByTestId('balance-suggestion').filter({ hasText: 'works at both' }).filter({ hasText: quietName }).first()
      await rota.getByTestId('suggestion-move-rota').click()
      const dialog = page.getByTestId('impact-dialog')
      await dialog.waitFor()
      await dialog.getByTestId('impact-confirm').click()
      await expect.poll(async () => (await testDb()('shift_exceptions').where({ provider_id: quiet.providerIds[0], start_date: day }).select('kind', 'site_id')).map((row) => `${row.kind}@${row.site_id}`).sort())
        .toEqual([`extra@${tight.siteId}`, `time_off@${quiet.siteId}`])
      // The saved move takes its suggestion away; the answer stays at the top of the list.
      await expect.poll(() => page.getByRole('status').filter({ hasText: /^Moved: .* works at Test annex .* that day, all day\./ }).count(), { timeout: 15_000 }).toBe(1)
      await screenshot(page, 'balance-rota-moved-1024')
    })
  })
}

