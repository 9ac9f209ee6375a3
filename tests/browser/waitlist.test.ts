// Issue 17 §2 on screen, in real Chromium: the front desk cancels a visit on the Chairboard, the freed
// time shows how many on the waitlist fit it, the desk sends offers; two patients open their offer
// links (read from the real mail catcher), one accepts and gets the time, the other is told it has just
// been taken. Private annex whose zone makes it late morning now (tests/helpers/midday.ts): no demo weeks.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { randomUUID } from 'node:crypto'
import { openBrowser, screenshot, signInThroughForm, type BrowserSession } from '../helpers/browser'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { createStaff, middayZone, startIn, STAFF_PASSWORD } from '../helpers/midday'
import { mailsContaining, pollUntil } from '../helpers/mail'
import { addDays, todayIn } from '../../shared/utils/local-date'
import { freshNumber } from '../helpers/sms'

let desk: BrowserSession
let annex: Annex
let deskEmail: string
const emails: string[] = []
let visitId = 0
let patientName = ''

beforeAll(async () => {
  annex = await createAnnex({ rooms: 1, providers: 1, patients: 3, timeZone: middayZone() })
  await testDb()('sites').where({ id: annex.siteId }).update({ email: `annex-${randomUUID().slice(0, 8)}@fernhollow.test`, phone: '555-0144', address: '3 Mill Lane', colour: '#0f766e' })
  for (const id of annex.patientIds) {
    const email = `offer-${randomUUID().slice(0, 8)}@fernhollow.test`
    await testDb()('patients').where({ id }).update({ email, email_consent: true })
    emails.push(email)
  }
  // The first waiting patient also agreed to texts: their offer goes by e-mail and text.
  await testDb()('patients').where({ id: annex.patientIds[1] }).update({ phone: freshNumber().written, sms_consent: true })
  deskEmail = (await createStaff('front_desk', [annex.siteId])).email
  const admin = await signedInAs('admin@fernhollow.test')
  const booked = await admin.post('/api/visits', { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[0], items: FILLING, startUtc: startIn(150) })
  expect(booked.status, JSON.stringify(booked.body)).toBe(201)
  visitId = booked.body.id
  const patient = await testDb()('patients').where({ id: annex.patientIds[0] }).first('first_name', 'last_name')
  patientName = `${patient.first_name} ${patient.last_name}`
  for (const index of [1, 2]) {
    const entry = await admin.post('/api/waitlist', { patientId: annex.patientIds[index], siteId: annex.siteId, items: FILLING, from: todayIn(annex.timeZone), to: addDays(todayIn(annex.timeZone), 5), noticeMinutes: 60, priority: index })
    expect(entry.status, JSON.stringify(entry.body)).toBe(201)
  }
  desk = await openBrowser(inject('baseURL'), { width: 1400, height: 1100 })
})
afterAll(async () => {
  await desk?.close()
  await closeTestDb()
})

describe('a cancelled visit refills from the waitlist', () => {
  it('cancel → "2 on the waitlist fit" → send offers → one patient accepts, the other sees "taken"', async () => {
    const { page } = desk
    await signInThroughForm(page, deskEmail, STAFF_PASSWORD)
    await page.waitForURL(/\/chairboard/)
    await page.getByRole('button', { name: `Open the visit of ${patientName}` }).first().click()
    const panel = page.getByTestId('visit-panel')
    await panel.getByLabel('Reason for cancelling').fill('The patient is ill')
    await panel.getByRole('button', { name: 'Cancel visit' }).click()
    const gap = page.getByTestId('waitlist-gap')
    await expect.poll(() => gap.getByTestId('waitlist-fit-count').textContent()).toBe('2 on the waitlist fit')
    await gap.getByTestId('show-matches').click()
    await expect.poll(() => gap.getByTestId('waitlist-match-row').count()).toBe(2)
    // How each offer would go: e-mail and text, or e-mail only.
    expect((await gap.getByTestId('offer-channels').allTextContents()).map((text) => text.trim()).sort()).toEqual(['· offer by e-mail', '· offer by e-mail and text'])
    await screenshot(page, 'waitlist-freed-gap')
    await gap.getByTestId('send-offers').click()
    await expect.poll(() => gap.getByTestId('waitlist-gap-message').textContent()).toContain('Offers sent to 2 patients')
    // Per offer, the channels it went by.
    expect(await gap.getByTestId('waitlist-gap-message').textContent()).toMatch(/by e-mail and text; .* by e-mail\)|by e-mail; .* by e-mail and text\)/)
    await screenshot(page, 'waitlist-offers-sent')

    // The offer e-mails as they arrived at the mail catcher; their links open the offer page.
    const links: string[] = []
    for (const email of [emails[1]!, emails[2]!]) {
      const mails = await pollUntil(() => mailsContaining(email), (found) => found.some((mail) => (mail.parsed.subject ?? '').includes('An earlier time at')))
      const mail = mails.find((found) => (found.parsed.subject ?? '').includes('An earlier time at'))!
      links.push(/See the time and accept: (\S+)/.exec(mail.parsed.text ?? '')![1]!)
    }
    const first = await openBrowser(inject('baseURL'), { width: 390, height: 844 })
    const second = await openBrowser(inject('baseURL'), { width: 390, height: 844 })
    try {
      await first.page.goto(links[0]!)
      await second.page.goto(links[1]!)
      await first.page.getByTestId('offer-accept').waitFor()
      await second.page.getByTestId('offer-accept').waitFor()
      await screenshot(first.page, 'waitlist-offer-page')
      await first.page.getByTestId('offer-accept').click()
      await expect.poll(() => first.page.getByTestId('offer-outcome').textContent()).toContain('This time is booked for you')
      await screenshot(first.page, 'waitlist-offer-accepted')
      await second.page.getByTestId('offer-accept').click()
      await expect.poll(() => second.page.getByTestId('offer-problem').textContent()).toContain('this time has just been taken')
      await screenshot(second.page, 'waitlist-offer-taken')
    } finally {
      await first.close()
      await second.close()
    }
    const live = await testDb()('visits').where({ site_id: annex.siteId }).whereNot('state', 'cancelled').select('patient_id')
    expect(live).toEqual([{ patient_id: annex.patientIds[1] }])
    expect(visitId).toBeGreaterThan(0)
  })

  it('the Waitlist page keeps the patient who did not get the time, and the drawer link opens its form', async () => {
    const { page } = desk
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Waitlist' }).click()
    await expect.poll(() => page.getByTestId('waitlist-row').count()).toBe(1)
    const second = await testDb()('patients').where({ id: annex.patientIds[2] }).first('first_name', 'last_name')
    expect(await page.getByTestId('waitlist-row').textContent()).toContain(`${second.first_name} ${second.last_name}`)
    await screenshot(page, 'waitlist-page')
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Chairboard' }).click()
    await page.getByRole('button', { name: 'Book a visit' }).click()
    await page.getByTestId('drawer-add-waitlist').click()
    await page.waitForURL(/\/waitlist\?add=1/)
    await page.getByTestId('waitlist-form').waitFor()
    await screenshot(page, 'waitlist-add-form')
  })
})
