// Issue 17 §3: Balance's "consolidate" suggestion becomes a move offer. The front desk sends it; the
// patient (or a minor's guardian) gets an e-mail and/or a text (the channels they agreed to; real SMTP into
// the catcher, real HTTP to the SMS fake) with a signed link; the page shows both times; accepting
// moves the visit through the booking service's move (the same locks and overlap checks), so a time
// taken meanwhile is a 409 and the visit stays; declining or expiry leave the visit untouched.
// Private annexes only (createMailAnnex): no demo weeks used. Dates from today.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { DateTime } from 'luxon'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { FILLING } from '../helpers/booking-fixtures'
import { createStaff, startIn, STAFF_PASSWORD } from '../helpers/midday'
import { waitForOutboxMail } from '../helpers/mail'
import { signOfferToken } from '../../server/utils/offer-token'
import { formatDateTime } from '../../shared/utils/display-time'
import { fakeMessages, freshNumber, injectReply } from '../helpers/sms'

let annex: MailAnnex
let desk: ApiClient
let admin: ApiClient

beforeAll(async () => {
  // No quiet hours: texts go at once whatever the hour the suite runs.
  annex = await createMailAnnex({ patients: 11, settings: { quietHours: null } })
  admin = await signedInAs('admin@fernhollow.test')
  const staff = await createStaff('front_desk', [annex.siteId])
  desk = new ApiClient()
  await desk.signIn(staff.email, STAFF_PASSWORD)
}, 60_000)
afterAll(async () => { await closeTestDb() })

const DAY_MINUTES = 24 * 60
const HOUR_MS = 3_600_000

async function book(patientIndex: number, startUtc: string) {
  const response = await admin.post('/api/visits', {
    siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[patientIndex], items: FILLING, startUtc,
  })
  expect(response.status, JSON.stringify(response.body)).toBe(201)
  return response.body as { id: number; startUtc: string; endUtc: string; rowVersion: number }
}

/** A visit three days ahead (plus `hours`) and a proposed time two hours later, both from today. */
async function visitWithProposal(patientIndex: number, hours = 0) {
  const visit = await book(patientIndex, startIn(3 * DAY_MINUTES + hours * 60))
  const proposed = new Date(Date.parse(visit.startUtc) + 2 * HOUR_MS).toISOString()
  return { visit, proposed }
}

async function send(visitId: number, startUtc: string, client = desk) {
  return client.post(`/api/visits/${visitId}/move-offers`, { startUtc })
}

async function tokenOf(moveOfferId: number): Promise<string> {
  const row = await testDb()('move_offers').where({ id: moveOfferId }).first('id', 'nonce')
  return signOfferToken(process.env.NUXT_MAIL_LINK_SECRET!, row, 'move-offer')
}

async function visitStart(visitId: number): Promise<string> {
  const row = await testDb()('visits').where({ id: visitId }).first('start_utc')
  return (row.start_utc as Date).toISOString()
}

async function auditActions(moveOfferId: number): Promise<string[]> {
  return (await testDb()('audit_log').where({ entity: 'move_offer', entity_id: String(moveOfferId) }).orderBy('id').pluck('action')) as string[]
}

describe('sending a move offer', () => {
  it('needs a booking role at the visit\'s site: 401 signed out, 403 for a provider or another site\'s desk', async () => {
    const { visit, proposed } = await visitWithProposal(0)
    expect((await send(visit.id, proposed, new ApiClient())).status).toBe(401)
    const dentist = await createStaff('dentist', [annex.siteId], { provider: true })
    const asDentist = new ApiClient()
    await asDentist.signIn(dentist.email, STAFF_PASSWORD)
    expect((await send(visit.id, proposed, asDentist)).status).toBe(403)
    const otherDesk = await createStaff('front_desk', [])
    const asOther = new ApiClient()
    await asOther.signIn(otherDesk.email, STAFF_PASSWORD)
    expect((await send(visit.id, proposed, asOther)).status).toBe(403)
    expect(await testDb()('move_offers').where({ visit_id: visit.id }).count({ n: '*' })).toEqual([{ n: 0 }])
  })

  it('refuses bad input in words: 400 naming startUtc, 409 when the time is not free now', async () => {
    const { visit, proposed } = await visitWithProposal(1, 6)
    const bad = await send(visit.id, 'tomorrow')
    expect(bad.status).toBe(400)
    expect(JSON.stringify(bad.body)).toContain('startUtc')
    const same = await send(visit.id, new Date(visit.startUtc).toISOString())
    expect(same.status).toBe(400)
    await book(2, proposed)
    const taken = await send(visit.id, proposed)
    expect(taken.status, JSON.stringify(taken.body)).toBe(409)
    expect(await testDb()('move_offers').where({ visit_id: visit.id }).count({ n: '*' })).toEqual([{ n: 0 }])
  })

  it('409 when the patient has not agreed to e-mail (consent is respected)', async () => {
    const { visit, proposed } = await visitWithProposal(3, 12)
    await testDb()('patients').where({ id: annex.patientIds[3] }).update({ email_consent: false })
    const refused = await send(visit.id, proposed)
    expect(refused.status).toBe(409)
    expect(JSON.stringify(refused.body)).toContain('agreed to e-mail')
  })
})

describe('the patient answers', () => {
  it('send → the e-mail arrives with the link → accept moves the visit, a change e-mail is queued, audit rows written', async () => {
    const { visit, proposed } = await visitWithProposal(4, 18)
    const sent = await send(visit.id, proposed)
    expect(sent.status, JSON.stringify(sent.body)).toBe(201)
    expect(Date.parse(sent.body.expiresAtUtc)).toBeGreaterThan(Date.now())
    expect(await visitStart(visit.id)).toBe(new Date(visit.startUtc).toISOString()) // sending moves nothing
    const row = await testDb()('outbox').where({ kind: 'move_offer', visit_id: visit.id }).first('id')
    const mail = await waitForOutboxMail(annex.emails[4]!, row.id)
    expect(mail.parsed.subject).toContain('Could your visit')
    const link = /\/move-offer\/([A-Za-z0-9._%-]+)/.exec(mail.parsed.text ?? '')
    expect(link).not.toBeNull()
    const token = decodeURIComponent(link![1]!)
    const patient = new ApiClient()
    const shown = await patient.get(`/api/move-offer/${encodeURIComponent(token)}`)
    expect(shown.status).toBe(200)
    expect(shown.body.state).toBe('sent')
    expect(shown.body.currentStartUtc).toBe(new Date(visit.startUtc).toISOString())
    expect(shown.body.startUtc).toBe(proposed)
    const accepted = await patient.post(`/api/move-offer/${encodeURIComponent(token)}/accept`)
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
    expect(accepted.body.state).toBe('accepted')
    expect(await visitStart(visit.id)).toBe(proposed)
    const update = await testDb()('outbox').where({ kind: 'update', visit_id: visit.id }).first('id')
    expect(update).toBeDefined()
    expect(await auditActions(sent.body.moveOfferId)).toEqual(['move_offer_sent', 'move_offer_accepted'])
    const moved = await testDb()('audit_log').where({ entity: 'visit', entity_id: String(visit.id), action: 'visit_moved' }).first('user_id')
    expect(moved.user_id).toBeNull() // moved by the patient's answer, not a staff account
    // A second press of the same link keeps the answer.
    expect((await patient.post(`/api/move-offer/${encodeURIComponent(token)}/accept`)).body.state).toBe('accepted')
  })

  it('decline keeps the visit where it is; the link can no longer move it', async () => {
    const { visit, proposed } = await visitWithProposal(5, 24)
    const sent = await send(visit.id, proposed)
    expect(sent.status).toBe(201)
    const token = await tokenOf(sent.body.moveOfferId)
    const declined = await new ApiClient().post(`/api/move-offer/${encodeURIComponent(token)}/decline`)
    expect(declined.status).toBe(200)
    expect(declined.body.state).toBe('declined')
    expect(declined.body.message).toContain('stays at')
    expect(await visitStart(visit.id)).toBe(new Date(visit.startUtc).toISOString())
    expect((await new ApiClient().post(`/api/move-offer/${encodeURIComponent(token)}/accept`)).status).toBe(409)
    expect(await visitStart(visit.id)).toBe(new Date(visit.startUtc).toISOString())
    expect(await auditActions(sent.body.moveOfferId)).toEqual(['move_offer_sent', 'move_offer_declined'])
  })

  it('the time was taken meanwhile: 409 "no longer free; your visit stays at …", visit unchanged', async () => {
    const { visit, proposed } = await visitWithProposal(6, 30)
    const sent = await send(visit.id, proposed)
    expect(sent.status).toBe(201)
    await book(7, proposed)
    const token = await tokenOf(sent.body.moveOfferId)
    const accepted = await new ApiClient().post(`/api/move-offer/${encodeURIComponent(token)}/accept`)
    expect(accepted.status).toBe(409)
    expect(JSON.stringify(accepted.body)).toContain('This time is no longer free; your visit stays at')
    expect(await visitStart(visit.id)).toBe(new Date(visit.startUtc).toISOString())
    expect(await auditActions(sent.body.moveOfferId)).toEqual(['move_offer_sent', 'move_offer_taken'])
  })

  it('expired: the page says so, accept is 410, the visit stays; bad or edited tokens are 404', async () => {
    const { visit, proposed } = await visitWithProposal(0, 36)
    const sent = await send(visit.id, proposed)
    expect(sent.status).toBe(201)
    const token = await tokenOf(sent.body.moveOfferId)
    await testDb()('move_offers').where({ id: sent.body.moveOfferId }).update({ expires_at: new Date(Date.now() - 60_000) })
    const shown = await new ApiClient().get(`/api/move-offer/${encodeURIComponent(token)}`)
    expect(shown.status).toBe(200)
    expect(shown.body.state).toBe('expired')
    expect((await new ApiClient().post(`/api/move-offer/${encodeURIComponent(token)}/accept`)).status).toBe(410)
    expect(await visitStart(visit.id)).toBe(new Date(visit.startUtc).toISOString())
    expect(await auditActions(sent.body.moveOfferId)).toEqual(['move_offer_sent', 'move_offer_expired'])
    // Edited, malformed, or a waitlist offer's signature over the same id and nonce: not a move offer link.
    const edited = `${token.slice(0, -2)}${token.endsWith('AA') ? 'BB' : 'AA'}`
    expect((await new ApiClient().get(`/api/move-offer/${encodeURIComponent(edited)}`)).status).toBe(404)
    expect((await new ApiClient().get('/api/move-offer/not-a-token')).status).toBe(404)
    const row = await testDb()('move_offers').where({ id: sent.body.moveOfferId }).first('id', 'nonce')
    expect((await new ApiClient().get(`/api/move-offer/${encodeURIComponent(signOfferToken(process.env.NUXT_MAIL_LINK_SECRET!, row))}`)).status).toBe(404)
  })

  it('a minor\'s move offer goes to the guardian, naming the patient', async () => {
    const { visit, proposed } = await visitWithProposal(1, 42)
    const guardianEmail = `guardian-move-${visit.id}@fernhollow.test`
    const birth = DateTime.now().minus({ years: 9 }).toISODate()!
    await testDb()('patients').where({ id: annex.patientIds[1] }).update({ date_of_birth: birth, guardian_name: 'Rosa Quill', guardian_email: guardianEmail })
    const sent = await send(visit.id, proposed)
    expect(sent.status, JSON.stringify(sent.body)).toBe(201)
    const row = await testDb()('outbox').where({ kind: 'move_offer', visit_id: visit.id }).first('id')
    const mail = await waitForOutboxMail(guardianEmail, row.id)
    expect(mail.parsed.text).toContain('Hello Rosa Quill')
    expect(mail.parsed.text).toContain('The dental visit for')
    expect(mail.raw).not.toContain(annex.emails[1]!)
  })
})

describe('by text as well (texts of issue 18)', () => {
  const moveRows = (visitId: number) => testDb()('outbox').where({ kind: 'move_offer', visit_id: visitId }).orderBy('id')

  async function sentText(visitId: number, to: string) {
    await expect.poll(async () => (await moveRows(visitId)).find((row) => row.channel === 'sms')?.state, { timeout: 20_000, interval: 200 }).toBe('sent')
    const row = (await moveRows(visitId)).find((row) => row.channel === 'sms')!
    const text = (await fakeMessages(to)).find((message) => message.sid === row.message_id)
    expect(text, `move offer text at ${to}`).toBeDefined()
    return text!.body
  }

  it('a consenting patient gets the e-mail and a text with both times and the same link; the texted link opens the page and accepting moves the visit once', async () => {
    const number = freshNumber()
    await testDb()('patients').where({ id: annex.patientIds[8] }).update({ phone: number.written, sms_consent: true })
    const { visit, proposed } = await visitWithProposal(8, 48)
    const sent = await send(visit.id, proposed)
    expect(sent.status, JSON.stringify(sent.body)).toBe(201)
    expect(sent.body.channels).toEqual(['email', 'sms'])
    const text = await sentText(visit.id, number.e164)
    const site = await testDb()('sites').where({ id: annex.siteId }).first('time_zone', 'clock', 'date_order')
    const style = { timeZone: site.time_zone, clock: site.clock, dateOrder: site.date_order }
    // Both times in the site's clock and date order, through the shared formatter.
    expect(text).toContain(`could your visit on ${formatDateTime(visit.startUtc, style)} move to ${formatDateTime(proposed, style)}?`)
    const link = /(https?:\/\/\S+\/move-offer\/([A-Za-z0-9._%-]+))$/.exec(text)
    expect(link).not.toBeNull()
    const mail = await waitForOutboxMail(annex.emails[8]!, (await moveRows(visit.id)).find((row) => row.channel === 'email')!.id)
    expect(mail.parsed.text).toContain(link![1])
    const page = await fetch(link![1]!)
    expect(page.status).toBe(200)
    expect(page.headers.get('content-type')).toContain('text/html')
    const token = decodeURIComponent(link![2]!)
    const accepted = await new ApiClient().post(`/api/move-offer/${encodeURIComponent(token)}/accept`)
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(200)
    expect(await visitStart(visit.id)).toBe(proposed)
    expect((await new ApiClient().post(`/api/move-offer/${encodeURIComponent(token)}/accept`)).body.state).toBe('accepted')
    expect(await testDb()('audit_log').where({ entity: 'visit', entity_id: String(visit.id), action: 'visit_moved' }).count({ n: '*' })).toEqual([{ n: 1 }])
  })

  it('without text consent only the e-mail goes; a minor\'s text goes to the guardian\'s phone; with neither channel, 409 in words', async () => {
    const mailOnly = freshNumber()
    await testDb()('patients').where({ id: annex.patientIds[9] }).update({ phone: mailOnly.written, sms_consent: false })
    const first = await visitWithProposal(9, 54)
    const sent = await send(first.visit.id, first.proposed)
    expect(sent.status, JSON.stringify(sent.body)).toBe(201)
    expect(sent.body.channels).toEqual(['email'])
    expect((await moveRows(first.visit.id)).map((row) => row.channel)).toEqual(['email'])
    await waitForOutboxMail(annex.emails[9]!, (await moveRows(first.visit.id))[0]!.id)
    expect(await fakeMessages(mailOnly.e164)).toEqual([])

    const child = freshNumber()
    const guardian = freshNumber()
    await testDb()('patients').where({ id: annex.patientIds[10] }).update({
      date_of_birth: DateTime.now().minus({ years: 9 }).toISODate(), phone: child.written, sms_consent: true,
      guardian_name: 'Rosa Quill', guardian_email: null, guardian_phone: guardian.written,
    })
    const second = await visitWithProposal(10, 60)
    const minor = await send(second.visit.id, second.proposed)
    expect(minor.status, JSON.stringify(minor.body)).toBe(201)
    // No guardian e-mail on file: the e-mail would go to the child, so only the guardian's text goes.
    expect(minor.body.channels).toEqual(['sms'])
    const text = await sentText(second.visit.id, guardian.e164)
    const { first_name: firstName } = await testDb()('patients').where({ id: annex.patientIds[10] }).first('first_name')
    expect(text).toContain(`Hello Rosa Quill, could ${firstName}'s visit on`)
    expect(await fakeMessages(child.e164)).toEqual([])

    await testDb()('patients').where({ id: annex.patientIds[10] }).update({ guardian_phone: null })
    const third = await visitWithProposal(10, 66)
    const refused = await send(third.visit.id, third.proposed)
    expect(refused.status).toBe(409)
    expect(JSON.stringify(refused.body)).toMatch(/No move offer sent: no e-mail or text can reach them: .*no guardian e-mail address.*; .*no guardian mobile number/)
    expect(await testDb()('move_offers').where({ visit_id: third.visit.id }).count({ n: '*' })).toEqual([{ n: 0 }])
  })

  it('a "C" after a move offer text confirms and moves nothing: the reply shows in the visit\'s thread and the site\'s unanswered texts, pointed to the link once; STOP still opts out', async () => {
    const patientId = annex.patientIds[2]!
    const number = freshNumber()
    await testDb()('patients').where({ id: patientId }).update({ phone: number.written, sms_consent: true, sms_opted_out_at: null })
    const { visit, proposed } = await visitWithProposal(2, 72)
    const sent = await send(visit.id, proposed)
    expect(sent.status, JSON.stringify(sent.body)).toBe(201)
    await sentText(visit.id, number.e164)
    const before = await testDb()('visits').where({ patient_id: patientId }).orderBy('id').select('id', 'state', 'start_utc', 'confirmed_at', 'cancel_requested_at')

    for (const body of ['C', 'Yes']) {
      const reply = await injectReply(inject('baseURL'), number.e164, body)
      expect(reply.webhookStatus).toBe(200)
      expect(await testDb()('sms_replies').where({ message_sid: reply.sid }).first()).toMatchObject({ outcome: 'offer_reply', site_id: annex.siteId, visit_id: visit.id })
    }
    // No visit of the patient confirmed, moved or asked to be cancelled; the offer still open.
    expect(await testDb()('visits').where({ patient_id: patientId }).orderBy('id').select('id', 'state', 'start_utc', 'confirmed_at', 'cancel_requested_at')).toEqual(before)
    expect((await testDb()('move_offers').where({ id: sent.body.moveOfferId }).first('state')).state).toBe('sent')
    const thread = await desk.get(`/api/visits/${visit.id}/texts`)
    expect((thread.body.entries as Array<{ direction: string; text: string; state: string }>).filter((entry) => entry.direction === 'in').map((entry) => [entry.text, entry.state])).toEqual([['C', 'offer_reply'], ['Yes', 'offer_reply']])
    const listed = (await desk.get(`/api/sms/unanswered?siteId=${annex.siteId}`)).body as Array<{ visitId: number; body: string }>
    expect(listed.filter((row) => row.visitId === visit.id).map((row) => row.body)).toEqual(['Yes', 'C'])
    const pointer = async () => (await fakeMessages(number.e164)).filter((message) => message.body.includes('please use the link in our text'))
    await expect.poll(async () => (await pointer()).length, { timeout: 20_000, interval: 200 }).toBe(1)
    expect(await testDb()('audit_log').where({ entity: 'visit', entity_id: String(visit.id) }).whereIn('action', ['visit_confirmed', 'visit_cancel_requested', 'visit_cancelled']).count({ n: '*' })).toEqual([{ n: 0 }])

    await injectReply(inject('baseURL'), number.e164, 'stop')
    expect((await testDb()('patients').where({ id: patientId }).first('sms_opted_out_at')).sms_opted_out_at).not.toBeNull()
    await expect.poll(async () => (await fakeMessages(number.e164)).some((message) => message.body.includes('you will get no more texts from us')), { timeout: 20_000, interval: 200 }).toBe(true)
    // The Outbox names the patient for the move offer's rows too.
    const rows = (await admin.get(`/api/outbox?siteId=${annex.siteId}&visitId=${visit.id}&limit=50`)).body as Array<{ kind: string; channel: string; recipient: string | null }>
    expect(rows.filter((row) => row.kind === 'move_offer').map((row) => [row.channel, row.recipient]).sort()).toEqual([['email', annex.emails[2]], ['sms', number.written]])
  })
})
