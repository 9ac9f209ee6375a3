// Issue 17 §3 in real Chromium: the front desk sends a move offer (the route the Balance button calls);
// the patient opens the link from the e-mail as it arrived at the mail catcher, sees the current and the
// proposed time in the site's format, and moves the visit; a second patient keeps their time.
// Private annex, dates from today: no demo weeks.
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { openBrowser, screenshot, type BrowserSession } from '../helpers/browser'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { FILLING } from '../helpers/booking-fixtures'
import { createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { createStaff, startIn, STAFF_PASSWORD } from '../helpers/midday'
import { waitForOutboxMail } from '../helpers/mail'
import { displayStyleOf, formatDateTime } from '../../shared/utils/display-time'

let annex: MailAnnex
let desk: ApiClient
const sessions: BrowserSession[] = []

beforeAll(async () => {
  annex = await createMailAnnex({ patients: 2 })
  const staff = await createStaff('front_desk', [annex.siteId])
  desk = new ApiClient()
  await desk.signIn(staff.email, STAFF_PASSWORD)
}, 60_000)
afterAll(async () => {
  for (const session of sessions) await session.close()
  await closeTestDb()
})

async function offerLink(patientIndex: number, hoursAhead: number) {
  const admin = await signedInAs('admin@fernhollow.test')
  const booked = await admin.post('/api/visits', { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[patientIndex], items: FILLING, startUtc: startIn(hoursAhead * 60) })
  expect(booked.status, JSON.stringify(booked.body)).toBe(201)
  const proposed = new Date(Date.parse(booked.body.startUtc) + 2 * 3_600_000).toISOString()
  const sent = await desk.post(`/api/visits/${booked.body.id}/move-offers`, { startUtc: proposed })
  expect(sent.status, JSON.stringify(sent.body)).toBe(201)
  const row = await testDb()('outbox').where({ kind: 'move_offer', visit_id: booked.body.id }).first('id')
  const mail = await waitForOutboxMail(annex.emails[patientIndex]!, row.id)
  const link = /See both times and answer: (\S+)/.exec(mail.parsed.text ?? '')![1]!
  return { visitId: booked.body.id as number, startUtc: booked.body.startUtc as string, proposed, link }
}

describe('the move offer page', () => {
  it('shows both times in the site\'s format; "Move my visit" moves it (1440×900)', async () => {
    const offer = await offerLink(0, 80)
    const session = await openBrowser(inject('baseURL'), { width: 1440, height: 900 })
    sessions.push(session)
    await session.page.goto(offer.link)
    await session.page.getByTestId('move-offer-accept').waitFor()
    const site = await testDb()('sites').where({ id: annex.siteId }).first('time_zone', 'clock', 'date_order')
    const style = displayStyleOf({ timeZone: site.time_zone, clock: site.clock, dateOrder: site.date_order })
    expect(await session.page.getByTestId('move-offer-current').textContent()).toContain(formatDateTime(offer.startUtc, style, 'long'))
    expect(await session.page.getByTestId('move-offer-proposed').textContent()).toContain(formatDateTime(offer.proposed, style, 'long'))
    await screenshot(session.page, 'move-offer-page-1440')
    await session.page.getByTestId('move-offer-accept').click()
    await expect.poll(() => session.page.getByTestId('move-offer-outcome').textContent()).toContain('Your visit has moved')
    await screenshot(session.page, 'move-offer-accepted-1440')
    const row = await testDb()('visits').where({ id: offer.visitId }).first('start_utc')
    expect((row.start_utc as Date).toISOString()).toBe(offer.proposed)
  })

  it('"Keep my current time" leaves the visit where it is (1024×768)', async () => {
    const offer = await offerLink(1, 90)
    const session = await openBrowser(inject('baseURL'), { width: 1024, height: 768 })
    sessions.push(session)
    await session.page.goto(offer.link)
    await session.page.getByTestId('move-offer-decline').click()
    await expect.poll(() => session.page.getByTestId('move-offer-outcome').textContent()).toContain('You kept your current time')
    await screenshot(session.page, 'move-offer-declined-1024')
    const row = await testDb()('visits').where({ id: offer.visitId }).first('start_utc')
    expect((row.start_utc as Date).toISOString()).toBe(new Date(offer.startUtc).toISOString())
  })
})
