// Issue 13 §1–2 in real Chromium: time off for a dentist with booked visits shows whom it strands
// before saving; after saving the visits are marked "needs a new time" on the Chairboard and listed on
// the Rebook list; one is moved to another provider from the list and the patient's update e-mail
// arrives at the mail catcher. On a test annex of its own (any day), so no demo week is taken.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { closeTestDb, testDb } from '../helpers/db'
import { signedInAs } from '../helpers/api-client'
import { utcAt, FILLING } from '../helpers/booking-fixtures'
import { createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { waitForOutboxMail } from '../helpers/mail'
import { daysFromToday } from '../helpers/dates'

let browser: BrowserSession
let annex: MailAnnex
let day: string
let dentist: string
const visitIds: number[] = []

beforeAll(async () => {
  browser = await openBrowser(inject('baseURL'))
  annex = await createMailAnnex({ patients: 2, providers: 2 })
  const names = await testDb()('providers').join('users', 'users.id', 'providers.user_id').whereIn('providers.id', annex.providerIds).orderBy('providers.id').pluck('users.name')
  dentist = names[0]
  await testDb()('patients').where({ id: annex.patientIds[0] }).update({ phone: '555-0131' })
  // Tomorrow on the annex's clock, so the board is one "Next day" away.
  day = daysFromToday(1, annex.timeZone)
  const admin = await signedInAs('admin@fernhollow.test')
  for (const [index, time] of ['09:00', '11:00'].entries()) {
    const booked = await admin.post('/api/visits', {
      siteId: annex.siteId, operatoryId: annex.operatoryIds[index], providerId: annex.providerIds[0], patientId: annex.patientIds[index],
      startUtc: utcAt(`${day}T${time}`, annex.timeZone), items: FILLING,
    })
    expect(booked.status, JSON.stringify(booked.body)).toBe(201)
    visitIds.push(booked.body.id)
  }
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('Rebook list in the browser', () => {
  it('shows the visits time off would strand before saving, and flags them after', async () => {
    const { page } = browser
    await signInThroughForm(page, 'manager@fernhollow.test')
    await page.waitForURL(/\/chairboard$/)
    await page.getByTestId('site-switcher').selectOption(String(annex.siteId))
    await page.getByRole('link', { name: 'Rota' }).click()
    await page.waitForURL(/\/rota$/)
    await page.getByRole('button', { name: 'Time off or extra shift' }).click()
    const form = page.getByRole('dialog', { name: 'Time off or extra shift' })
    await form.getByLabel('Provider').selectOption({ label: dentist })
    // From and To, the form's two dates.
    const dates = form.locator('input[type="date"]')
    await expect.poll(() => dates.count()).toBe(2)
    await dates.nth(0).fill(day)
    await dates.nth(1).fill(day)
    await screenshot(page, 'rebook-time-off-form')
    await form.getByRole('button', { name: 'Save' }).click()

    const impact = page.getByTestId('impact-dialog')
    await expect.poll(() => impact.isVisible()).toBe(true)
    expect(await impact.getByTestId('impact-heading').textContent()).toBe('2 booked visits would lose their dentist:')
    const lines = await impact.getByTestId('impact-visits').locator('li').allTextContents()
    expect(lines).toHaveLength(2)
    expect(lines[0]).toContain('Annex0 Patient')
    expect(lines[0]).toContain('9:00 AM') // the annex keeps the 12-hour clock (site setting)
    expect(lines[0]).toContain(`${dentist} is away`)
    // Focus moved into the dialog, on the safe choice.
    expect(await page.evaluate(() => document.activeElement?.textContent?.trim())).toBe('Cancel the change')
    await screenshot(page, 'rebook-impact-before-saving')
    // Nothing is written before the choice.
    expect(await testDb()('shift_exceptions').where({ provider_id: annex.providerIds[0] }).first('id')).toBeUndefined()

    await impact.getByTestId('impact-confirm').click()
    await expect.poll(() => page.getByRole('dialog').count()).toBe(0)
    expect(Number((await testDb()('visits').whereIn('id', visitIds).whereNotNull('stranded_reason').count({ n: '*' }).first())?.n)).toBe(2)

    // The Chairboard marks both, in words as well as a glyph.
    await page.getByRole('link', { name: 'Chairboard' }).click()
    await page.waitForURL(/\/chairboard$/)
    await page.locator('#board-date').fill(day)
    const marks = page.getByTestId('visit-block').getByTestId('stranded-mark')
    await expect.poll(() => marks.count()).toBe(2)
    expect(await marks.first().textContent()).toContain('needs a new time')
    await page.locator(`[data-visit-id="${visitIds[0]}"]`).first().click()
    await expect.poll(() => page.getByTestId('panel-stranded').textContent()).toContain(`${dentist} is away`)
    await screenshot(page, 'rebook-chairboard-flagged')
  })

  it('lists them on the Rebook list with the count in the navigation, and moves one to another provider', async () => {
    const { page } = browser
    await expect.poll(() => page.getByTestId('rebook-count').first().textContent()).toContain('2')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: /^Rebook list/ }).click()
    await page.waitForURL(/\/rebook$/)
    const rows = page.getByTestId('rebook-row')
    await expect.poll(() => rows.count()).toBe(2)
    const first = rows.first()
    expect(await first.textContent()).toContain('Annex0 Patient')
    expect(await first.textContent()).toContain('555-0131')
    expect(await first.textContent()).toContain(`${dentist} is away`)
    await screenshot(page, 'rebook-list')

    await first.getByRole('button', { name: 'Find a new time' }).click()
    const other = first.getByTestId('rebook-group-any')
    await expect.poll(() => other.getByRole('button', { name: 'Move here' }).count(), { timeout: 40_000 }).toBeGreaterThan(0)
    await screenshot(page, 'rebook-openings')
    await other.getByRole('button', { name: 'Move here' }).first().click()
    await expect.poll(() => page.getByTestId('rebook-notice').textContent()).toContain('The patient gets the update e-mail')
    await expect.poll(() => rows.count()).toBe(1)
    await expect.poll(() => page.getByTestId('rebook-count').first().textContent()).toContain('1')
    await screenshot(page, 'rebook-after-move')

    const moved = await testDb()('visits').where({ id: visitIds[0] }).first('provider_id', 'stranded_reason')
    expect(moved).toEqual({ provider_id: annex.providerIds[1], stranded_reason: null })
    // The update e-mail reaches the patient through the real SMTP catcher.
    const update = await testDb()('outbox').where({ visit_id: visitIds[0], kind: 'update' }).first('id')
    expect(update).toBeDefined()
    await waitForOutboxMail(annex.emails[0]!, update.id, 30_000)
  })
})
