// Issue 17 §2: the waitlist refills freed time. A cancelled visit or one marked did not come frees its
// chair time; the waiting patients whose plan fits it (the openings engine restricted to that time) are
// ranked by priority, then by how long they have waited. Offers go by e-mail and by text (to the channels
// the patient, or a minor's guardian, agreed to: real SMTP into the catcher, real HTTP to the SMS fake);
// the first patient to accept gets the time through the booking transaction, everyone else hears "this
// time has just been taken". Private annexes only (createMailAnnex): no demo weeks used.
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { DateTime } from 'luxon'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { FILLING } from '../helpers/booking-fixtures'
import { startIn } from '../helpers/midday'
import { signOfferToken } from '../../server/utils/offer-token'
import { formatDateTime } from '../../shared/utils/display-time'
import { waitForOutboxMail } from '../helpers/mail'
import { fakeMessages, freshNumber, injectReply } from '../helpers/sms'

let annex: MailAnnex
let admin: ApiClient

beforeAll(async () => {
  // No quiet hours: texts go at once whatever the hour the suite runs.
  annex = await createMailAnnex({ patients: 35, settings: { quietHours: null } })
  admin = await signedInAs('admin@fernhollow.test')
})
afterAll(async () => { await closeTestDb() })

const today = () => DateTime.now().setZone(annex.timeZone).toISODate()!
const daysAhead = (days: number) => DateTime.now().setZone(annex.timeZone).plus({ days }).toISODate()!

async function book(patientIndex: number, startUtc: string, operatoryIndex = 0) {
  const response = await admin.post('/api/visits', {
    siteId: annex.siteId, operatoryId: annex.operatoryIds[operatoryIndex], providerId: annex.providerIds[0], patientId: annex.patientIds[patientIndex], items: FILLING, startUtc,
  })
  expect(response.status, JSON.stringify(response.body)).toBe(201)
  return response.body as { id: number; startUtc: string; rowVersion: number }
}

async function wait(patientIndex: number, options: { priority?: number; noticeMinutes?: number; partOfDay?: string } = {}) {
  const response = await admin.post('/api/waitlist', {
    patientId: annex.patientIds[patientIndex], siteId: annex.siteId, items: FILLING, from: today(), to: daysAhead(5),
    priority: options.priority ?? 3, noticeMinutes: options.noticeMinutes ?? 0, partOfDay: options.partOfDay ?? 'any',
  })
  expect(response.status, JSON.stringify(response.body)).toBe(201)
  return response.body as { id: number; state: string }
}

async function closeAll() {
  await testDb()('waitlist_entries').where({ site_id: annex.siteId, state: 'open' }).update({ state: 'closed' })
}

async function tokenOf(offerId: number): Promise<string> {
  const row = await testDb()('offers').where({ id: offerId }).first('id', 'nonce')
  return signOfferToken(process.env.NUXT_MAIL_LINK_SECRET!, row)
}

async function setBack(id: number, minutes: number) {
  for (const table of ['visits', 'visit_segments']) {
    await testDb()(table).where(table === 'visits' ? { id } : { visit_id: id }).update({
      start_utc: testDb().raw('start_utc - INTERVAL ? MINUTE', [minutes]), end_utc: testDb().raw('end_utc - INTERVAL ? MINUTE', [minutes]),
    })
  }
}

describe('waitlist entries', () => {
  it('needs a booking role, checks its fields and the site', async () => {
    expect((await new ApiClient().get(`/api/waitlist?siteId=${annex.siteId}`)).status).toBe(401)
    const bad = await admin.post('/api/waitlist', { patientId: annex.patientIds[0], siteId: annex.siteId, items: FILLING, from: daysAhead(3), to: today() })
    expect(bad.status).toBe(400)
    expect(JSON.stringify(bad.body)).toContain('to')
    const unknownTemplate = await admin.post('/api/waitlist', { patientId: annex.patientIds[0], siteId: annex.siteId, items: [{ templateCode: 'NOPE' }], from: today(), to: today() })
    expect(unknownTemplate.status).toBe(400)
    const provider = await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('providers.id', annex.providerIds[0]).first('users.email')
    const dentist = new ApiClient()
    await dentist.signIn(provider.email, 'annex-provider-password')
    expect((await dentist.get(`/api/waitlist?siteId=${annex.siteId}`)).status).toBe(403)
  })

  it('lists open entries first by priority and closes one', async () => {
    const low = await wait(0, { priority: 4 })
    const high = await wait(1, { priority: 1 })
    const list = await admin.get(`/api/waitlist?siteId=${annex.siteId}`)
    expect(list.status).toBe(200)
    const ids = (list.body as Array<{ id: number }>).map((entry) => entry.id)
    expect(ids.indexOf(high.id)).toBeLessThan(ids.indexOf(low.id))
    const closed = await admin.post(`/api/waitlist/${low.id}/close`, { reason: 'Found a time elsewhere' })
    expect(closed.status).toBe(200)
    expect(closed.body.state).toBe('closed')
    expect((await admin.post(`/api/waitlist/${low.id}/close`, {})).status).toBe(409)
    await closeAll()
  })
})

describe('matching freed time', () => {
  it('a cancellation: entries that fit, by priority then longest waiting', async () => {
    const visit = await book(0, startIn(26 * 60))
    const older = await wait(1, { priority: 3 })
    const newer = await wait(2, { priority: 3 })
    const urgent = await wait(3, { priority: 1 })
    expect((await admin.get(`/api/waitlist/matches?visitId=${visit.id}`)).status).toBe(409) // still holds its time
    const cancelled = await admin.post(`/api/visits/${visit.id}/cancel`, { reason: 'Patient is travelling' })
    expect(cancelled.status).toBe(200)
    const found = await admin.get(`/api/waitlist/matches?visitId=${visit.id}`)
    expect(found.status, JSON.stringify(found.body)).toBe(200)
    expect(found.body.matches.map((match: { entry: { id: number } }) => match.entry.id)).toEqual([urgent.id, older.id, newer.id])
    expect(found.body.matches[0].startUtc).toBe(new Date(visit.startUtc).toISOString())
    await closeAll()
  })

  it('did not come: only patients who can come at such short notice', async () => {
    const visit = await book(4, startIn(10), 1)
    await setBack(visit.id, 30) // started 20 minutes ago
    const missed = await admin.post(`/api/visits/${visit.id}/state`, { state: 'missed' })
    expect(missed.status, JSON.stringify(missed.body)).toBe(200)
    const nearby = await wait(5, { noticeMinutes: 0 })
    const needsNotice = await wait(6, { noticeMinutes: 240 })
    const found = await admin.get(`/api/waitlist/matches?visitId=${visit.id}`)
    expect(found.status, JSON.stringify(found.body)).toBe(200)
    const ids = found.body.matches.map((match: { entry: { id: number } }) => match.entry.id)
    expect(ids).toContain(nearby.id)
    expect(ids).not.toContain(needsNotice.id)
    // Starts only from now on, inside the freed time.
    expect(Date.parse(found.body.matches[0].startUtc)).toBeGreaterThanOrEqual(Date.now() - 60_000)
    await closeAll()
  })

  it('no offer for a patient whose notice the slot cannot meet', async () => {
    const visit = await book(7, startIn(60), 1)
    await admin.post(`/api/visits/${visit.id}/cancel`, { reason: 'Ill' })
    const needsNotice = await wait(8, { noticeMinutes: 180 })
    const sent = await admin.post('/api/waitlist/offers', { visitId: visit.id, entryIds: [needsNotice.id] })
    expect(sent.status, JSON.stringify(sent.body)).toBe(200)
    expect(sent.body.sent).toEqual([])
    expect(sent.body.skipped).toEqual([{ entryId: needsNotice.id, reason: 'the time is too soon for the notice this patient needs' }])
    expect(await testDb()('offers').where({ entry_id: needsNotice.id }).count({ n: '*' }).first()).toMatchObject({ n: 0 })
    await closeAll()
  })
})

describe('offers', () => {
  it('20 patients accept one offered time at once: exactly one booking, 19 "taken"', async () => {
    const visit = await book(9, startIn(50 * 60))
    await admin.post(`/api/visits/${visit.id}/cancel`, { reason: 'Moved away' })
    const entries = []
    for (let index = 10; index < 30 && index < annex.patientIds.length; index += 1) entries.push(await wait(index))
    const sent = await admin.post('/api/waitlist/offers', { visitId: visit.id, entryIds: entries.map((entry) => entry.id) })
    expect(sent.status, JSON.stringify(sent.body)).toBe(200)
    expect(sent.body.sent).toHaveLength(entries.length)
    // Expiry: the site default of 2 hours.
    expect(Date.parse(sent.body.sent[0].expiresAtUtc) - Date.now()).toBeGreaterThan(110 * 60_000)
    expect(Date.parse(sent.body.sent[0].expiresAtUtc) - Date.now()).toBeLessThanOrEqual(120 * 60_000)
    const tokens = await Promise.all(sent.body.sent.map((offer: { offerId: number }) => tokenOf(offer.offerId)))
    const shown = await new ApiClient().get(`/api/offer/${encodeURIComponent(tokens[0])}`)
    expect(shown.status).toBe(200)
    expect(shown.body).toMatchObject({ state: 'sent', startUtc: new Date(visit.startUtc).toISOString() })

    const answers = await Promise.all(tokens.map((token) => new ApiClient().post(`/api/offer/${encodeURIComponent(token)}/accept`)))
    const statuses = answers.map((answer) => answer.status)
    expect(statuses.filter((status) => status === 201), JSON.stringify(answers.map((a) => a.body))).toHaveLength(1)
    expect(statuses.filter((status) => status === 409)).toHaveLength(entries.length - 1)
    for (const answer of answers.filter((a) => a.status === 409)) expect(answer.body.message).toContain('this time has just been taken')

    const winner = answers.findIndex((answer) => answer.status === 201)
    const winningEntry = entries[winner]!
    const booked = await testDb()('visits').where({ site_id: annex.siteId, start_utc: new Date(visit.startUtc) }).whereNot('state', 'cancelled').select('id', 'patient_id')
    expect(booked).toHaveLength(1)
    // The accepted offer's patient leaves the waitlist; the others stay on it.
    const states = await testDb()('waitlist_entries').whereIn('id', entries.map((entry) => entry.id)).select('id', 'state', 'booked_visit_id')
    expect(states.filter((row) => row.state === 'booked')).toEqual([{ id: winningEntry.id, state: 'booked', booked_visit_id: booked[0].id }])
    expect(states.filter((row) => row.state === 'open')).toHaveLength(entries.length - 1)
    // A late opener sees that it has gone.
    const late = await new ApiClient().get(`/api/offer/${encodeURIComponent(tokens[(winner + 1) % tokens.length])}`)
    expect(late.body.state).toBe('taken')
    expect(late.body.message).toContain('this time has just been taken')
    // Audit: one row per offer, per acceptance and per "taken".
    const actions = await testDb()('audit_log').where({ entity: 'offer' }).whereIn('entity_id', sent.body.sent.map((offer: { offerId: number }) => String(offer.offerId))).select('action')
    const count = (action: string) => actions.filter((row) => row.action === action).length
    expect([count('offer_sent'), count('offer_accepted'), count('offer_taken')]).toEqual([entries.length, 1, entries.length - 1])
    await closeAll()
  })

  it('an expired offer is refused in words, and a refusal keeps the patient waiting', async () => {
    const visit = await book(0, startIn(74 * 60), 1)
    await admin.post(`/api/visits/${visit.id}/cancel`, { reason: 'Moved away' })
    const first = await wait(1)
    const second = await wait(2)
    const sent = await admin.post('/api/waitlist/offers', { visitId: visit.id, entryIds: [first.id, second.id] })
    expect(sent.body.sent).toHaveLength(2)
    const [expiring, refusing] = sent.body.sent as Array<{ offerId: number }>
    await testDb()('offers').where({ id: expiring!.offerId }).update({ expires_at: new Date(Date.now() - 60_000) })
    const late = await new ApiClient().post(`/api/offer/${encodeURIComponent(await tokenOf(expiring!.offerId))}/accept`)
    expect(late.status).toBe(410)
    expect(late.body.message).toContain('This offer has expired')
    expect(await testDb()('audit_log').where({ entity: 'offer', entity_id: String(expiring!.offerId), action: 'offer_expired' }).count({ n: '*' }).first()).toMatchObject({ n: 1 })
    const no = await new ApiClient().post(`/api/offer/${encodeURIComponent(await tokenOf(refusing!.offerId))}/refuse`)
    expect(no.status).toBe(200)
    expect(no.body.state).toBe('refused')
    expect((await testDb()('waitlist_entries').where({ id: second.id }).first('state')).state).toBe('open')
    // A tampered link is simply not valid.
    const tampered = (await tokenOf(refusing!.offerId)).slice(0, -2) + 'AA'
    expect((await new ApiClient().get(`/api/offer/${encodeURIComponent(tampered)}`)).status).toBe(404)
    await closeAll()
  })
})

describe('offers by text as well (issue 17 §2, texts of issue 18)', () => {
  const offerRows = (offerId: number) => testDb()('outbox').where({ kind: 'offer' }).whereRaw("JSON_EXTRACT(payload, '$.offerId') = ?", [offerId]).orderBy('id')

  async function sentText(offerId: number, to: string) {
    await expect.poll(async () => (await offerRows(offerId)).find((row) => row.channel === 'sms')?.state, { timeout: 20_000, interval: 200 }).toBe('sent')
    const row = (await offerRows(offerId)).find((row) => row.channel === 'sms')!
    const text = (await fakeMessages(to)).find((message) => message.sid === row.message_id)
    expect(text, `text of offer ${offerId} at ${to}`).toBeDefined()
    return text!.body
  }

  it('e-mail and text to a consenting patient, e-mail only without text consent, the guardian\'s phone for a minor, nobody reachable skipped; the texted link opens the page and books once', async () => {
    const [both, mailOnly, minor, nobody] = [30, 31, 32, 33].map((index) => annex.patientIds[index]!)
    const numbers = { both: freshNumber(), mailOnly: freshNumber(), child: freshNumber(), guardian: freshNumber() }
    await testDb()('patients').where({ id: both }).update({ phone: numbers.both.written, sms_consent: true })
    await testDb()('patients').where({ id: mailOnly }).update({ phone: numbers.mailOnly.written, sms_consent: false })
    const guardianEmail = `guardian-offer-${annex.siteId}@fernhollow.test`
    await testDb()('patients').where({ id: minor }).update({
      date_of_birth: DateTime.now().minus({ years: 9 }).toISODate(), phone: numbers.child.written, sms_consent: true,
      guardian_name: 'Rosa Quill', guardian_email: guardianEmail, guardian_phone: numbers.guardian.written,
    })
    await testDb()('patients').where({ id: nobody }).update({ email_consent: false, sms_consent: false })

    const visit = await book(34, startIn(98 * 60))
    await admin.post(`/api/visits/${visit.id}/cancel`, { reason: 'Moved away' })
    const entries = [await wait(30), await wait(31), await wait(32), await wait(33)]
    // Before sending, the gap panel says how each offer would go.
    const found = await admin.get(`/api/waitlist/matches?visitId=${visit.id}`)
    expect(found.status, JSON.stringify(found.body)).toBe(200)
    const planned = new Map((found.body.matches as Array<{ entry: { id: number }; channels: string[]; canOffer: boolean }>).map((match) => [match.entry.id, match]))
    expect(entries.map((entry) => planned.get(entry.id)?.channels)).toEqual([['email', 'sms'], ['email'], ['email', 'sms'], []])
    expect(planned.get(entries[3]!.id)?.canOffer).toBe(false)

    const sent = await admin.post('/api/waitlist/offers', { visitId: visit.id, entryIds: entries.map((entry) => entry.id) })
    expect(sent.status, JSON.stringify(sent.body)).toBe(200)
    const offerOf = new Map((sent.body.sent as Array<{ entryId: number; offerId: number; channels: string[] }>).map((offer) => [offer.entryId, offer]))
    expect(entries.map((entry) => offerOf.get(entry.id)?.channels)).toEqual([['email', 'sms'], ['email'], ['email', 'sms'], undefined])
    // Neither channel: no offer made, and the front desk reads why.
    expect(sent.body.skipped).toHaveLength(1)
    expect(sent.body.skipped[0].entryId).toBe(entries[3]!.id)
    expect(sent.body.skipped[0].reason).toMatch(/^no e-mail or text can reach them: the patient has not agreed to e-mail; the patient has not agreed to texts$/)
    expect(await testDb()('offers').where({ entry_id: entries[3]!.id }).count({ n: '*' }).first()).toMatchObject({ n: 0 })
    // The matches now say which channels the open offers went by.
    const after = await admin.get(`/api/waitlist/matches?visitId=${visit.id}`)
    expect((after.body.matches as Array<{ entry: { id: number }; offeredBy: string[] }>).find((match) => match.entry.id === entries[0]!.id)?.offeredBy).toEqual(['email', 'sms'])

    const site = await testDb()('sites').where({ id: annex.siteId }).first('time_zone', 'clock', 'date_order')
    const when = formatDateTime(visit.startUtc, { timeZone: site.time_zone, clock: site.clock, dateOrder: site.date_order })
    const bothOffer = offerOf.get(entries[0]!.id)!
    const text = await sentText(bothOffer.offerId, numbers.both.e164)
    expect(text).toMatch(/^Test annex[^:]*: a dental visit time has come free: /)
    expect(text).toContain(when) // the site's clock and date order, through the shared formatter
    const mailRow = (await offerRows(bothOffer.offerId)).find((row) => row.channel === 'email')!
    const mail = await waitForOutboxMail(annex.emails[30]!, mailRow.id)
    // The same signed link in both.
    const textLink = /(https?:\/\/\S+\/offer\/([A-Za-z0-9._%-]+))$/.exec(text)
    expect(textLink).not.toBeNull()
    expect(mail.parsed.text).toContain(textLink![1])

    // E-mail only: no text row, nothing at the fake for that number.
    const mailOnlyOffer = offerOf.get(entries[1]!.id)!
    expect((await offerRows(mailOnlyOffer.offerId)).map((row) => row.channel)).toEqual(['email'])
    await waitForOutboxMail(annex.emails[31]!, (await offerRows(mailOnlyOffer.offerId))[0]!.id)
    expect(await fakeMessages(numbers.mailOnly.e164)).toEqual([])

    // A minor: the guardian's phone and e-mail, greeting the guardian and naming the child; never the child's phone.
    const minorOffer = offerOf.get(entries[2]!.id)!
    const guardianText = await sentText(minorOffer.offerId, numbers.guardian.e164)
    const child = await testDb()('patients').where({ id: minor }).first('first_name')
    expect(guardianText).toContain(`Hello Rosa Quill, a dental visit time has come free for ${child.first_name}`)
    await waitForOutboxMail(guardianEmail, (await offerRows(minorOffer.offerId)).find((row) => row.channel === 'email')!.id)
    expect(await fakeMessages(numbers.child.e164)).toEqual([])
    // The Outbox names the guardian as the recipient of both the minor's offer rows (shared/domain/message-recipient.ts).
    const minorIds = (await offerRows(minorOffer.offerId)).map((row) => row.id)
    const listed = (await admin.get(`/api/outbox?siteId=${annex.siteId}&limit=200`)).body as Array<{ id: number; channel: string; recipient: string | null }>
    expect(listed.filter((row) => minorIds.includes(row.id)).map((row) => [row.channel, row.recipient]).sort()).toEqual([
      ['email', `${guardianEmail} (guardian: Rosa Quill)`], ['sms', `${numbers.guardian.written} (guardian: Rosa Quill)`],
    ])

    // The texted link opens the offer page; accepting from it books the time, once.
    const page = await fetch(textLink![1]!)
    expect(page.status).toBe(200)
    expect(page.headers.get('content-type')).toContain('text/html')
    const token = decodeURIComponent(textLink![2]!)
    const shown = await new ApiClient().get(`/api/offer/${encodeURIComponent(token)}`)
    expect(shown.body).toMatchObject({ state: 'sent', startUtc: new Date(visit.startUtc).toISOString() })
    const accepted = await new ApiClient().post(`/api/offer/${encodeURIComponent(token)}/accept`)
    expect(accepted.status, JSON.stringify(accepted.body)).toBe(201)
    expect(accepted.body.state).toBe('accepted')
    const again = await new ApiClient().post(`/api/offer/${encodeURIComponent(token)}/accept`)
    expect(again.body.state).toBe('accepted')
    const late = await new ApiClient().post(`/api/offer/${encodeURIComponent(await tokenOf(minorOffer.offerId))}/accept`)
    expect(late.status).toBe(409)
    const booked = await testDb()('visits').where({ site_id: annex.siteId, start_utc: new Date(visit.startUtc) }).whereNot('state', 'cancelled').select('patient_id')
    expect(booked).toEqual([{ patient_id: both }])
    await closeAll()
  })

  it('a reply to an offer text lands in the offering site\'s unanswered texts, is pointed to the link once, confirms no visit; STOP still opts out; the Outbox names who each offer row went to', async () => {
    const patientId = annex.patientIds[9]!
    const number = freshNumber()
    await testDb()('patients').where({ id: patientId }).update({ phone: number.written, sms_consent: true, sms_opted_out_at: null })
    // A visit of theirs waiting for an answer: a "C" meant for the offer must not confirm it.
    const own = await book(9, startIn(30 * 60), 1)
    const freed = await book(33, startIn(54 * 60), 1)
    await admin.post(`/api/visits/${freed.id}/cancel`, { reason: 'Moved away' })
    const entry = await wait(9)
    const sent = await admin.post('/api/waitlist/offers', { visitId: freed.id, entryIds: [entry.id] })
    expect(sent.status, JSON.stringify(sent.body)).toBe(200)
    const offerId = (sent.body.sent as Array<{ offerId: number }>)[0]!.offerId
    await sentText(offerId, number.e164)

    const reply = await injectReply(inject('baseURL'), number.e164, 'C')
    expect(reply.webhookStatus).toBe(200)
    const kept = await testDb()('sms_replies').where({ message_sid: reply.sid }).first()
    expect(kept).toMatchObject({ outcome: 'offer_reply', site_id: annex.siteId, visit_id: null, patient_id: patientId })
    expect((await testDb()('visits').where({ id: own.id }).first('state')).state).toBe('booked')
    expect((await testDb()('offers').where({ id: offerId }).first('state')).state).toBe('sent')
    // The front desk of the offering site sees it.
    const listed = await admin.get(`/api/sms/unanswered?siteId=${annex.siteId}`)
    expect((listed.body as Array<{ id: number; body: string }>).find((row) => row.id === kept.id)).toMatchObject({ body: 'C' })
    // One answer, pointing to the link; a second reply is listed but not answered again.
    const pointer = async () => (await fakeMessages(number.e164)).filter((message) => message.body.includes('please use the link in our text'))
    await expect.poll(async () => (await pointer()).length, { timeout: 20_000, interval: 200 }).toBe(1)
    expect((await pointer())[0]!.body).toMatch(/^Test annex[^:]*: thank you, the front desk has your message\. To answer our offer, please use the link in our text\.$/)
    const second = await injectReply(inject('baseURL'), number.e164, 'Is it with the same dentist?')
    expect((await testDb()('sms_replies').where({ message_sid: second.sid }).first()).outcome).toBe('offer_reply')
    expect(await testDb()('outbox').where({ kind: 'reply_confirmation' }).whereRaw("JSON_VALUE(payload, '$.replyId') = ?", [
      (await testDb()('sms_replies').where({ message_sid: second.sid }).first('id')).id]).count({ n: '*' })).toEqual([{ n: 0 }])

    // STOP still opts the number out, with its one notice.
    await injectReply(inject('baseURL'), number.e164, 'STOP')
    expect((await testDb()('patients').where({ id: patientId }).first('sms_opted_out_at')).sms_opted_out_at).not.toBeNull()
    await expect.poll(async () => (await fakeMessages(number.e164)).some((message) => message.body.includes('you will get no more texts from us')), { timeout: 20_000, interval: 200 }).toBe(true)

    // The Outbox names the patient each offer row went to, e-mail and text (no visit on these rows).
    const rows = (await admin.get(`/api/outbox?siteId=${annex.siteId}&limit=200`)).body as Array<{ id: number; channel: string; recipient: string | null; patientName: string | null }>
    const ids = (await offerRows(offerId)).map((row) => row.id)
    const patient = await testDb()('patients').where({ id: patientId }).first('first_name', 'last_name', 'email')
    expect(rows.filter((row) => ids.includes(row.id)).map((row) => [row.channel, row.recipient, row.patientName]).sort()).toEqual([
      ['email', patient.email, `${patient.first_name} ${patient.last_name}`], ['sms', number.written, `${patient.first_name} ${patient.last_name}`],
    ])
    await closeAll()
  })
})
