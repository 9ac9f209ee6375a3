// The Outbox screen and the patient's visit page in real Chromium: a visit booked just now shows its
// invitation, and the confirm link from that very e-mail confirms the visit without signing in.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { DateTime } from 'luxon'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { bookingFor, createMailAnnex, outboxRowsOf, type MailAnnex } from '../helpers/mail-fixtures'
import { visitLinkOf, waitForOutboxMail } from '../helpers/mail'
import { atAhead, weekdayAhead, MONDAY } from '../helpers/dates'

let staff: BrowserSession
let patient: BrowserSession
let annex: MailAnnex
let visitId: number
let invitationId: number

beforeAll(async () => {
  annex = await createMailAnnex({ patients: 1 })
  const manager = await signedInAs('manager@fernhollow.test')
  const booked = await manager.post('/api/visits', bookingFor(annex, 0, atAhead(2, MONDAY, '10:30', 'America/Los_Angeles')))
  expect(booked.status).toBe(201)
  visitId = booked.body.id
  invitationId = (await outboxRowsOf(visitId)).find((row) => row.kind === 'invitation')!.id
  staff = await openBrowser(inject('baseURL'))
  patient = await openBrowser(inject('baseURL'))
  // The Outbox shows the selected site: pick the test site as the site switcher would.
  await staff.context.addCookies([{ name: 'cuspline-site', value: String(annex.siteId), url: inject('baseURL') }])
})
afterAll(async () => {
  await staff?.close()
  await patient?.close()
  await closeTestDb()
})

describe('Outbox screen', () => {
  it('shows the invitation of a visit booked just now, with its rendered e-mail and .ics', async () => {
    const { page } = staff
    await waitForOutboxMail(annex.emails[0]!, invitationId)
    await signInThroughForm(page, 'manager@fernhollow.test')
    await page.waitForURL(/\/chairboard$/)
    await page.goto('/outbox')
    const row = page.getByTestId(`outbox-row-${invitationId}`)
    await row.waitFor()
    expect(await row.textContent()).toContain('Invitation')
    expect(await row.textContent()).toContain('sent')
    await row.getByRole('button').click()
    await expect.poll(() => page.getByTestId('outbox-subject').textContent()).toMatch(/^Your dental visit at Test annex/)
    // The HTML part as the patient sees it, in a sandboxed frame.
    await page.frameLocator('iframe[title="E-mail as the patient sees it"]').getByText('Confirm I am coming').waitFor()
    await screenshot(page, 'outbox-invitation')
    await page.getByRole('tab', { name: 'Calendar (.ics)' }).click()
    expect(await page.getByTestId('outbox-ics').textContent()).toContain('METHOD:REQUEST')
    await page.getByRole('tab', { name: 'Plain text' }).click()
    expect(await page.getByTestId('outbox-text').textContent()).toContain('/visit/')
  })

  it('opens the confirm link from that e-mail, signed out, and confirms the visit', async () => {
    const mail = await waitForOutboxMail(annex.emails[0]!, invitationId)
    const { page } = patient
    await page.goto(visitLinkOf(mail))
    await expect.poll(() => page.getByTestId('visit-status').textContent()).toBe('Please let us know whether you are coming.')
    expect(await page.getByTestId('visit-when').textContent()).toContain(`${DateTime.fromISO(weekdayAhead(2, MONDAY, 'America/Los_Angeles')).toFormat('cccc, LLLL d, yyyy')} at 10:30 AM`)
    await screenshot(page, 'visit-link-before')
    await page.getByRole('button', { name: 'I will be there' }).click()
    await expect.poll(() => page.getByTestId('visit-status').textContent()).toBe('You have confirmed this visit. Thank you.')
    expect(await page.getByRole('button', { name: 'I will be there' }).count()).toBe(0)
    await screenshot(page, 'visit-link-confirmed')
    expect((await testDb()('visits').where({ id: visitId }).first()).state).toBe('confirmed')
  })

  it('shows a tampered link as not valid', async () => {
    const mail = await waitForOutboxMail(annex.emails[0]!, invitationId)
    // The visit page's own address (the first link is the confirm link, ?do=confirm).
    const link = visitLinkOf(mail).split('?')[0]!
    await patient.page.goto(`${link.slice(0, -3)}xyz`)
    await expect.poll(() => patient.page.getByTestId('visit-link-error').textContent()).toMatch(/not valid/)
    await screenshot(patient.page, 'visit-link-tampered')
  })
})
