// Issue 15 §1: patient e-mails as a phone and a desktop show them. The HTML of an invitation, a
// reminder and a cancellation, taken from the real mail catcher, rendered in Chromium at 390 and
// 800 px (screenshots in tests/artifacts/, looked at); and the visit page's cancel link, which asks
// before sending and takes an optional reason. Own test annex (week 10).
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { openBrowser, screenshot, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { bookingFor, createMailAnnex, outboxRowsOf, type MailAnnex } from '../helpers/mail-fixtures'
import { jsonOf, pollUntil, waitForOutboxMail, type Arrived } from '../helpers/mail'
import { atAhead, MONDAY, TUESDAY } from '../helpers/dates'

const ZONE = 'America/Los_Angeles'
let browser: BrowserSession
let annex: MailAnnex
const mails: Record<'invitation' | 'reminder' | 'cancellation', Arrived | undefined> = { invitation: undefined, reminder: undefined, cancellation: undefined }
let cancelLink = ''

async function rowOf(visitId: number, kind: string, state?: string) {
  const fits = (row: { kind: string; state: string }) => row.kind === kind && (!state || row.state === state)
  return (await pollUntil(() => outboxRowsOf(visitId), (rows) => rows.some(fits))).find(fits)!
}

beforeAll(async () => {
  annex = await createMailAnnex({ patients: 2 })
  await testDb()('sites').where({ id: annex.siteId }).update({ colour: '#7c3aed' })
  const manager = await signedInAs('manager@fernhollow.test')
  const booked = await manager.post('/api/visits', bookingFor(annex, 0, atAhead(10, MONDAY, '10:00', ZONE)))
  expect(booked.status).toBe(201)
  const visitId = booked.body.id
  mails.invitation = await waitForOutboxMail(annex.emails[0]!, (await rowOf(visitId, 'invitation')).id)
  const reminder = await rowOf(visitId, 'reminder', 'queued')
  await testDb()('outbox').where({ id: reminder.id }).update({ due_at: new Date() })
  mails.reminder = await waitForOutboxMail(annex.emails[0]!, reminder.id)
  expect((await manager.post(`/api/visits/${visitId}/cancel`, { reason: 'The dentist is away' })).status).toBe(200)
  mails.cancellation = await waitForOutboxMail(annex.emails[0]!, (await rowOf(visitId, 'cancellation')).id)

  const other = await manager.post('/api/visits', bookingFor(annex, 1, atAhead(10, TUESDAY, '10:00', ZONE)))
  const invitation = await waitForOutboxMail(annex.emails[1]!, (await rowOf(other.body.id, 'invitation')).id)
  cancelLink = /Ask us to cancel: (\S+)/.exec(invitation.parsed.text ?? '')![1]!
  browser = await openBrowser(inject('baseURL'))
})
afterAll(async () => {
  await browser?.close()
  await closeTestDb()
})

describe('patient e-mail HTML on a phone and a desktop', () => {
  for (const kind of ['invitation', 'reminder', 'cancellation'] as const) {
    for (const width of [390, 800]) {
      it(`${kind} at ${width} px: no sideways scrolling, site name on top, footer`, async () => {
        const { page } = browser
        await page.setViewportSize({ width, height: 900 })
        await page.setContent(String(mails[kind]!.parsed.html), { waitUntil: 'load' })
        // Mobile layout needs no horizontal scroll (WCAG 2.2 §1.4.10 Reflow, at 320 CSS px and up).
        expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(width)
        expect(await page.locator('[data-part="site"]').textContent()).toMatch(/^Test annex/)
        expect(await page.locator('[data-part="footer"]').textContent()).toMatch(/You got this/)
        await screenshot(page, `mail-${kind}-${width}`)
      })
    }
  }
})

describe('the stop-reminders link', () => {
  it('asks first, then turns reminders off; the page says changes and cancellations still come', async () => {
    const { page } = browser
    await page.setViewportSize({ width: 390, height: 900 })
    const link = /Stop reminders by e-mail [^:]*: (\S+)/.exec(mails.reminder!.parsed.text ?? '')![1]!
    await page.goto(link)
    await page.getByTestId('visit-stop-form').waitFor()
    expect((await testDb()('patients').where({ id: annex.patientIds[0] }).first()).reminders_off_at).toBeNull()
    await page.getByTestId('visit-stop-send').click()
    await expect.poll(() => page.getByTestId('visit-reminders-off').textContent()).toMatch(/Reminders by e-mail are off/)
    await screenshot(page, 'visit-reminders-off-390')
    expect((await testDb()('patients').where({ id: annex.patientIds[0] }).first()).reminders_off_at).not.toBeNull()
  })
})

describe('the cancel link', () => {
  it('asks before sending a cancel request, with an optional reason', async () => {
    const { page } = browser
    await page.setViewportSize({ width: 390, height: 900 })
    await page.goto(cancelLink)
    await page.getByTestId('visit-cancel-form').waitFor()
    await screenshot(page, 'visit-cancel-ask-390')
    // Nothing is sent by opening the link.
    const visit = await testDb()('visits').where({ patient_id: annex.patientIds[1] }).first()
    expect(visit.cancel_requested_at).toBeNull()
    await page.getByLabel('Reason').fill('Moving house that week')
    await page.getByTestId('visit-cancel-send').click()
    await expect.poll(() => page.getByTestId('visit-status').textContent()).toBe('You asked to cancel. The practice will get back to you.')
    await screenshot(page, 'visit-cancel-sent-390')
    const [audit] = await testDb()('audit_log').where({ action: 'visit_cancel_requested', entity_id: String(visit.id) })
    expect(jsonOf(audit.after)).toMatchObject({ note: 'Moving house that week' })
  })
})
