// A patient's text reply in real Chromium: "C" sent through the local SMS fake (signed as the real
// service signs, to the main test server's inbound webhook) shows the visit confirmed on the
// Chairboard within a few seconds, and the visit panel shows the text thread.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { bookingFor, createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { atAhead, weekdayAhead, THURSDAY } from '../helpers/dates'

const ZONE = 'America/Los_Angeles'
const FAKE = process.env.NUXT_SMS_FAKE_URL!
let staff: BrowserSession
let annex: MailAnnex
let visitId: number
let number: string

beforeAll(async () => {
  annex = await createMailAnnex({ patients: 1, settings: { quietHours: null, messageChannels: { invitation: ['email', 'sms'] } } })
  const area = String(600 + Math.floor(Math.random() * 300))
  number = `+1${area}5550142`
  await testDb()('patients').where({ id: annex.patientIds[0] }).update({ phone: `(${area}) 555-0142`, sms_consent: true })
  const manager = await signedInAs('manager@fernhollow.test')
  const booked = await manager.post('/api/visits', bookingFor(annex, 0, atAhead(2, THURSDAY, '10:00', ZONE)))
  expect(booked.status).toBe(201)
  visitId = booked.body.id
  staff = await openBrowser(inject('baseURL'), { width: 1400, height: 900 })
  // The Chairboard shows the selected site: pick the test site as the site switcher would.
  await staff.context.addCookies([{ name: 'cuspline-site', value: String(annex.siteId), url: inject('baseURL') }])
})
afterAll(async () => {
  await staff?.close()
  await closeTestDb()
})

describe('a text reply on the Chairboard', () => {
  it('C confirms the visit on the open board within seconds, and the panel shows the thread', async () => {
    const { page } = staff
    // The invitation text has gone out (the main test server's dispatcher, through the fake).
    await expect.poll(async () => (await testDb()('outbox').where({ visit_id: visitId, channel: 'sms', kind: 'invitation' }).first())?.state, { timeout: 20_000, interval: 250 }).toBe('sent')
    await signInThroughForm(page, 'manager@fernhollow.test')
    await page.waitForURL(/\/chairboard$/)
    await page.locator('#board-date').fill(weekdayAhead(2, THURSDAY, ZONE))
    const block = page.locator(`[data-visit-id="${visitId}"]`)
    await block.waitFor()
    expect(await block.textContent()).toMatch(/Booked/i)
    await block.click()
    const panel = page.getByTestId('visit-panel')
    const thread = panel.getByTestId('text-thread')
    await thread.getByTestId('text-out').filter({ hasText: 'is booked for' }).waitFor({ timeout: 10_000 })

    const injected = await fetch(`${FAKE}/_fake/inbound`, {
      method: 'POST', headers: { 'Content-Type': 'application/json' },
      body: JSON.stringify({ from: number, body: 'C', url: `${inject('baseURL')}/api/sms/inbound` }),
    })
    expect((await injected.json()).webhookStatus).toBe(200)
    // The board polls: the visit turns confirmed without a reload.
    await expect.poll(() => block.textContent(), { timeout: 10_000, interval: 250 }).toMatch(/Confirmed/i)
    await expect.poll(() => thread.getByTestId('text-in').first().textContent(), { timeout: 10_000 }).toMatch(/^C/)
    // The answer is queued with the confirmation, so the thread's reload on the visit's change shows it.
    await expect.poll(async () => (await thread.textContent()) ?? '', { timeout: 15_000, interval: 500 }).toMatch(/is confirmed/)
    await screenshot(page, 'sms-reply-confirmed')
  })
})
