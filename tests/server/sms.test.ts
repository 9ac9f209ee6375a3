// Text messages against the local SMS fake over HTTP (scripts/sms-fake.ts, started by npm test): the
// app sends through the twilio SDK redirected to the fake, the fake calls back signed as the real
// service signs (X-Twilio-Signature), and replies are injected through the fake. Each describe runs
// app servers of its own on a mail lane of its own, so the main test server never sends these texts.
import { randomUUID } from 'node:crypto'
import twilio from 'twilio'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient } from '../helpers/api-client'
import { startAppServer, type RunningServer } from '../helpers/app-server'
import { closeTestDb, testDb } from '../helpers/db'
import { bookingFor, createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { atAhead, MONDAY, TUESDAY, WEDNESDAY } from '../helpers/dates'
import { fakeMessages, freshNumber, injectReply } from '../helpers/sms'

const ZONE = 'America/Los_Angeles'
const TOKEN = process.env.NUXT_SMS_AUTH_TOKEN!
const servers: RunningServer[] = []
const ALL_TEXT = { invitation: ['email', 'sms'], update: ['email', 'sms'], cancellation: ['email', 'sms'], reminder: ['email', 'sms'], offer: ['email', 'sms'], move_offer: ['email', 'sms'] }
// Procedure, tooth and anaesthetic words a text must never carry (HHS OCR: minimum necessary, 45 CFR 164.502(b)).
const CLINICAL = /filling|composite|COMP-POST|tooth|surface|\bMO\b|numb|anaesthe|anesthe|molar/i


async function textAnnex(lane: string, settings: Record<string, unknown> = {}, patients = 4): Promise<MailAnnex & { numbers: string[] }> {
  // No quiet hours unless a test sets them: the suite runs at any hour.
  const annex = await createMailAnnex({ patients, mailLane: lane, settings: { quietHours: null, messageChannels: ALL_TEXT, ...settings } })
  const numbers: string[] = []
  for (const id of annex.patientIds) {
    const number = freshNumber()
    await testDb()('patients').where({ id }).update({ phone: number.written, sms_consent: true })
    numbers.push(number.e164)
  }
  return { ...annex, numbers }
}

function laneEnv(lane: string): Record<string, string> {
  return { NUXT_OUTBOX_LANE: lane, NUXT_OUTBOX_POLL_MS: '150', NUXT_OUTBOX_RETRY_BASE_SECONDS: '1', NUXT_OUTBOX_RETRY_MAX_SECONDS: '2' }
}

async function textRows(visitId: number) {
  return testDb()('outbox').where({ visit_id: visitId, channel: 'sms' }).orderBy('id')
}

/** Makes a visit's queued reminders due now (they were planned for days ahead). */
async function reminderDueNow(visitId: number): Promise<number[]> {
  const rows = await testDb()('outbox').where({ visit_id: visitId, kind: 'reminder', state: 'queued', channel: 'sms' }).orderBy('id').limit(1)
  await testDb()('outbox').whereIn('id', rows.map((row) => row.id)).update({ due_at: new Date() })
  return rows.map((row) => row.id)
}

afterAll(async () => {
  await Promise.all(servers.map((server) => server.stop()))
  await closeTestDb()
})

describe('texts through the fake', () => {
  const lane = `sms-${randomUUID().slice(0, 8)}`
  let server: RunningServer
  let annex: MailAnnex & { numbers: string[] }
  let desk: ApiClient

  beforeAll(async () => {
    server = await startAppServer(laneEnv(lane))
    servers.push(server)
    annex = await textAnnex(lane, {}, 6)
    desk = new ApiClient(server.url)
    await desk.signIn('manager@fernhollow.test')
  })

  it('sends invitation, update, cancellation and reminder as texts with no clinical words, SID and delivery stored', async () => {
    const booked = await desk.post('/api/visits', bookingFor(annex, 0, atAhead(3, MONDAY, '09:00', ZONE)))
    expect(booked.status).toBe(201)
    const id = booked.body.id as number
    await expect.poll(async () => (await textRows(id)).find((row) => row.kind === 'invitation')?.provider_status, { timeout: 20_000, interval: 200 }).toBe('delivered')
    const moved = await desk.patch(`/api/visits/${id}`, { rowVersion: booked.body.rowVersion, startUtc: atAhead(3, MONDAY, '11:00', ZONE) })
    expect(moved.status).toBe(200)
    await expect.poll(async () => (await textRows(id)).find((row) => row.kind === 'update')?.state, { timeout: 20_000, interval: 200 }).toBe('sent')
    await reminderDueNow(id)
    await expect.poll(async () => (await textRows(id)).some((row) => row.kind === 'reminder' && row.state === 'sent'), { timeout: 20_000, interval: 200 }).toBe(true)
    const cancelled = await desk.post(`/api/visits/${id}/cancel`, { reason: 'Patient phoned' })
    expect(cancelled.status).toBe(200)
    await expect.poll(async () => (await textRows(id)).find((row) => row.kind === 'cancellation')?.state, { timeout: 20_000, interval: 200 }).toBe('sent')

    const rows = (await textRows(id)).filter((row) => row.state === 'sent')
    const atFake = await fakeMessages(annex.numbers[0]!)
    for (const kind of ['invitation', 'update', 'reminder', 'cancellation']) {
      const row = rows.find((candidate) => candidate.kind === kind)!
      expect(row.message_id).toMatch(/^SM[0-9a-f]{32}$/)
      const text = atFake.find((message) => message.sid === row.message_id)!
      expect(text.body).toContain(`Test annex`)
      expect(text.body.replace(/https?:\S+/g, '')).not.toMatch(CLINICAL)
      expect(text.from).toBe(process.env.NUXT_SMS_FROM)
      if (kind !== 'cancellation') expect(text.body).toMatch(new RegExp(`${server.url}/visit/${id}\\.`))
    }
    // E-mail went out as well (both channels chosen by the site).
    expect((await testDb()('outbox').where({ visit_id: id, channel: 'email', kind: 'invitation' }).first()).state).toMatch(/queued|sending|sent/)
  })

  it('C confirms the visit waiting for an answer, answers with a text and writes an audit row', async () => {
    const booked = await desk.post('/api/visits', bookingFor(annex, 1, atAhead(3, TUESDAY, '09:00', ZONE)))
    const id = booked.body.id as number
    const answer = await injectReply(server.url, annex.numbers[1]!, 'c')
    expect(answer.webhookStatus).toBe(200)
    expect((await testDb()('visits').where({ id }).first()).state).toBe('confirmed')
    const reply = await testDb()('sms_replies').where({ message_sid: answer.sid }).first()
    expect(reply).toMatchObject({ outcome: 'confirmed', visit_id: id })
    expect(await testDb()('audit_log').where({ action: 'text_reply_received', entity: 'visit', entity_id: String(id) }).first()).toBeTruthy()
    expect(await testDb()('audit_log').where({ action: 'visit_confirmed', entity_id: String(id) }).first()).toBeTruthy()
    await expect.poll(async () => (await fakeMessages(annex.numbers[1]!)).some((message) => /is confirmed/.test(message.body)), { timeout: 20_000, interval: 200 }).toBe(true)
  })

  it('X raises a cancel request under the site\'s policy (request)', async () => {
    const booked = await desk.post('/api/visits', bookingFor(annex, 2, atAhead(3, WEDNESDAY, '09:00', ZONE)))
    const id = booked.body.id as number
    const answer = await injectReply(server.url, annex.numbers[2]!, 'X')
    expect(answer.webhookStatus).toBe(200)
    const visit = await testDb()('visits').where({ id }).first()
    expect(visit.state).toBe('booked')
    expect(visit.cancel_requested_at).not.toBeNull()
    const requests = await desk.get(`/api/outbox/cancel-requests?siteId=${annex.siteId}`)
    expect(requests.body.map((request: { visitId: number }) => request.visitId)).toContain(id)
    await expect.poll(async () => (await fakeMessages(annex.numbers[2]!)).some((message) => /request to cancel/.test(message.body)), { timeout: 20_000, interval: 200 }).toBe(true)
  })

  it('STOP stops further texts (a later reminder is skipped, logged); START resumes', async () => {
    const booked = await desk.post('/api/visits', bookingFor(annex, 3, atAhead(4, MONDAY, '09:00', ZONE)))
    const id = booked.body.id as number
    await injectReply(server.url, annex.numbers[3]!, 'STOP')
    expect((await testDb()('patients').where({ id: annex.patientIds[3] }).first()).sms_opted_out_at).not.toBeNull()
    await expect.poll(async () => (await fakeMessages(annex.numbers[3]!)).some((message) => /no more texts/.test(message.body)), { timeout: 20_000, interval: 200 }).toBe(true)
    const [stopped] = await reminderDueNow(id)
    await expect.poll(async () => (await testDb()('outbox').where({ id: stopped }).first()).state, { timeout: 20_000, interval: 200 }).toBe('skipped')
    expect((await testDb()('outbox').where({ id: stopped }).first()).last_error).toMatch(/STOP/)
    const sentBefore = (await fakeMessages(annex.numbers[3]!)).filter((message) => /reminder/.test(message.body)).length
    expect(sentBefore).toBe(0)

    await injectReply(server.url, annex.numbers[3]!, 'Start')
    expect((await testDb()('patients').where({ id: annex.patientIds[3] }).first()).sms_opted_out_at).toBeNull()
    const [resumed] = await reminderDueNow(id)
    await expect.poll(async () => (await testDb()('outbox').where({ id: resumed }).first()).state, { timeout: 20_000, interval: 200 }).toBe('sent')
    expect((await fakeMessages(annex.numbers[3]!)).some((message) => /reminder/.test(message.body))).toBe(true)
    expect(await testDb()('audit_log').where({ action: 'text_reply_received' }).whereRaw("JSON_EXTRACT(`after`, '$.outcome') = 'opted_out'").first()).toBeTruthy()
  })

  it('lists an unknown reply to the front desk and shows it in the visit\'s thread', async () => {
    const booked = await desk.post('/api/visits', bookingFor(annex, 4, atAhead(4, TUESDAY, '09:00', ZONE)))
    const id = booked.body.id as number
    await injectReply(server.url, annex.numbers[4]!, 'Can I come an hour later?')
    const listed = await desk.get(`/api/sms/unanswered?siteId=${annex.siteId}`)
    expect(listed.status).toBe(200)
    const reply = listed.body.find((entry: { body: string }) => entry.body === 'Can I come an hour later?')
    expect(reply).toMatchObject({ visitId: id, outcome: 'unanswered', patientId: annex.patientIds[4] })
    const thread = await desk.get(`/api/visits/${id}/texts`)
    expect(thread.body.entries.some((entry: { direction: string; text: string }) => entry.direction === 'in' && entry.text === 'Can I come an hour later?')).toBe(true)
    expect((await desk.post(`/api/sms/unanswered/${reply.id}/answered`)).status).toBe(200)
    expect((await desk.get(`/api/sms/unanswered?siteId=${annex.siteId}`)).body.some((entry: { id: number }) => entry.id === reply.id)).toBe(false)
  })

  it('the front desk texts the patient from the visit (logged), and the thread shows it', async () => {
    const booked = await desk.post('/api/visits', bookingFor(annex, 5, atAhead(4, WEDNESDAY, '09:00', ZONE)))
    const id = booked.body.id as number
    const sent = await desk.post(`/api/visits/${id}/texts`, { body: 'Please come ten minutes early to fill in a form.' })
    expect(sent.status).toBe(201)
    await expect.poll(async () => (await fakeMessages(annex.numbers[5]!)).some((message) => message.body === 'Please come ten minutes early to fill in a form.'), { timeout: 20_000, interval: 200 }).toBe(true)
    expect(await testDb()('audit_log').where({ action: 'text_written', entity_id: String(id) }).first()).toBeTruthy()
    expect((await desk.post(`/api/visits/${id}/texts`, { body: '' })).status).toBe(400)
    expect((await desk.post(`/api/visits/${id}/texts`, { body: 'x'.repeat(321) })).status).toBe(400)
    expect((await new ApiClient(server.url).post(`/api/visits/${id}/texts`, { body: 'hello' })).status).toBe(401)
    const otherSite = new ApiClient(server.url)
    await otherSite.signIn('desk.aspen@fernhollow.test')
    expect((await otherSite.get(`/api/visits/${id}/texts`)).status).toBe(403)
  })

  it('sites choose the channels per kind (GET/PUT settings); a wrong channel is a 400 naming it', async () => {
    const before = await desk.get(`/api/sites/${annex.siteId}/settings`)
    expect(before.body.messageChannels).toEqual(ALL_TEXT)
    const { messageChannels: _channels, ...rest } = before.body
    const changed = await desk.put(`/api/sites/${annex.siteId}/settings`, { ...rest, messageChannels: { ...ALL_TEXT, reminder: ['sms'] } })
    expect(changed.status).toBe(200)
    expect(changed.body.messageChannels.reminder).toEqual(['sms'])
    const wrong = await desk.put(`/api/sites/${annex.siteId}/settings`, { ...rest, messageChannels: { ...ALL_TEXT, reminder: ['fax'] } })
    expect(wrong.status).toBe(400)
    expect(JSON.stringify(wrong.body)).toContain('messageChannels.reminder.0')
    // Left out, the stored choice stays.
    expect((await desk.put(`/api/sites/${annex.siteId}/settings`, rest)).body.messageChannels.reminder).toEqual(['sms'])
    await desk.put(`/api/sites/${annex.siteId}/settings`, { ...rest, messageChannels: ALL_TEXT })
  })

  it('refuses forged webhook calls with 403 and changes nothing', async () => {
    const booked = await desk.post('/api/visits', bookingFor(annex, 0, atAhead(5, MONDAY, '09:00', ZONE)))
    const id = booked.body.id as number
    const sid = `SM${randomUUID().replace(/-/g, '')}`
    const params = { MessageSid: sid, From: annex.numbers[0]!, To: process.env.NUXT_SMS_FROM!, Body: 'C', AccountSid: process.env.NUXT_SMS_ACCOUNT_SID! }
    const url = `${server.url}/api/sms/inbound`
    const post = (headers: Record<string, string>) => fetch(url, { method: 'POST', headers: { 'Content-Type': 'application/x-www-form-urlencoded', ...headers }, body: new URLSearchParams(params).toString() })
    expect((await post({})).status).toBe(403)
    expect((await post({ 'X-Twilio-Signature': twilio.getExpectedTwilioSignature('not-the-account-token', url, params) })).status).toBe(403)
    // Signed for another URL (a replay against a different endpoint) fails too.
    expect((await post({ 'X-Twilio-Signature': twilio.getExpectedTwilioSignature(TOKEN, `${server.url}/api/sms/status`, params) })).status).toBe(403)
    expect((await testDb()('visits').where({ id }).first()).state).toBe('booked')
    expect(await testDb()('sms_replies').where({ message_sid: sid }).first()).toBeUndefined()

    const [text] = await textRows(id)
    const status = { MessageSid: text?.message_id ?? 'SMx', MessageStatus: 'failed', ErrorCode: '30008' }
    const statusUrl = `${server.url}/api/sms/status`
    const forged = await fetch(statusUrl, { method: 'POST', headers: { 'Content-Type': 'application/x-www-form-urlencoded', 'X-Twilio-Signature': 'AAAA' }, body: new URLSearchParams(status).toString() })
    expect(forged.status).toBe(403)
    expect((await fetch(statusUrl, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify(status) })).status).toBe(403)
    if (text) expect((await testDb()('outbox').where({ id: text.id }).first()).state).not.toBe('failed')
    // The real signature is accepted (the SDK's validateRequest on our side, getExpectedTwilioSignature here).
    const signed = await fetch(url, { method: 'POST', headers: { 'Content-Type': 'application/x-www-form-urlencoded', 'X-Twilio-Signature': twilio.getExpectedTwilioSignature(TOKEN, url, params) }, body: new URLSearchParams(params).toString() })
    expect(signed.status).toBe(200)
    expect((await testDb()('visits').where({ id }).first()).state).toBe('confirmed')
  })
})

describe('a failed invitation text', () => {
  it('falls back to e-mail when the patient has e-mail consent', async () => {
    const lane = `smsfail-${randomUUID().slice(0, 8)}`
    const server = await startAppServer(laneEnv(lane))
    servers.push(server)
    const annex = await textAnnex(lane, { messageChannels: { ...ALL_TEXT, invitation: ['sms'] } }, 1)
    const failing = freshNumber('99') // the fake fails 555-0199
    await testDb()('patients').where({ id: annex.patientIds[0] }).update({ phone: failing.written })
    const desk = new ApiClient(server.url)
    await desk.signIn('manager@fernhollow.test')
    const booked = await desk.post('/api/visits', bookingFor(annex, 0, atAhead(6, MONDAY, '09:00', ZONE)))
    const id = booked.body.id as number
    expect(await testDb()('outbox').where({ visit_id: id, kind: 'invitation', channel: 'email' }).first()).toBeUndefined()
    await expect.poll(async () => (await textRows(id)).find((row) => row.kind === 'invitation')?.state, { timeout: 20_000, interval: 200 }).toBe('failed')
    const text = (await textRows(id)).find((row) => row.kind === 'invitation')!
    expect(text.provider_status).toBe('failed')
    expect(text.last_error).toMatch(/30008/)
    await expect.poll(async () => (await testDb()('outbox').where({ visit_id: id, kind: 'invitation', channel: 'email' }).first())?.state, { timeout: 20_000, interval: 200 }).toBe('sent')
    const listed = await desk.get(`/api/outbox?siteId=${annex.siteId}&channel=sms&state=failed`)
    expect(listed.body.some((message: { id: number; channel: string }) => message.id === text.id && message.channel === 'sms')).toBe(true)
  })
})

describe('quiet hours', () => {
  it('hold a text until they end in the site\'s zone; the e-mail goes at once', async () => {
    const lane = `smsquiet-${randomUUID().slice(0, 8)}`
    const server = await startAppServer(laneEnv(lane))
    servers.push(server)
    // Quiet from an hour ago until an hour from now, on the annex's clock.
    const local = new Intl.DateTimeFormat('en-GB', { timeZone: ZONE, hour: '2-digit', minute: '2-digit', hourCycle: 'h23' })
    const hhmm = (ms: number) => local.format(new Date(ms))
    const quietHours = { start: hhmm(Date.now() - 3_600_000), end: hhmm(Date.now() + 3_600_000) }
    const annex = await textAnnex(lane, { quietHours }, 1)
    const desk = new ApiClient(server.url)
    await desk.signIn('manager@fernhollow.test')
    const booked = await desk.post('/api/visits', bookingFor(annex, 0, atAhead(6, TUESDAY, '09:00', ZONE)))
    const id = booked.body.id as number
    await expect.poll(async () => (await testDb()('outbox').where({ visit_id: id, kind: 'invitation', channel: 'email' }).first())?.state, { timeout: 20_000, interval: 200 }).toBe('sent')
    await expect.poll(async () => (await textRows(id)).find((row) => row.kind === 'invitation')?.last_error ?? '', { timeout: 20_000, interval: 200 }).toMatch(/quiet hours/)
    const text = (await textRows(id)).find((row) => row.kind === 'invitation')!
    expect(text.state).toBe('queued')
    expect(text.attempts).toBe(0)
    expect(hhmm(new Date(text.due_at).getTime())).toBe(quietHours.end)
    expect(await fakeMessages(annex.numbers[0]!)).toEqual([])
  })
})

describe('two dispatcher processes', () => {
  it('send each text once', async () => {
    const lane = `smspair-${randomUUID().slice(0, 8)}`
    const pair = await Promise.all([startAppServer(laneEnv(lane)), startAppServer(laneEnv(lane))])
    servers.push(...pair)
    const annex = await textAnnex(lane, { messageChannels: { ...ALL_TEXT, invitation: ['sms'] } }, 12)
    const desk = new ApiClient(pair[0].url)
    await desk.signIn('manager@fernhollow.test')
    const ids: number[] = []
    for (let index = 0; index < 12; index += 1) {
      // 90 minutes apart from 05:00, one provider: no clash whatever the template's length.
      const minutes = 5 * 60 + index * 90
      const time = `${String(Math.floor(minutes / 60)).padStart(2, '0')}:${String(minutes % 60).padStart(2, '0')}`
      const booked = await desk.post('/api/visits', bookingFor(annex, index, atAhead(7, MONDAY, time, ZONE)))
      expect(booked.status).toBe(201)
      ids.push(booked.body.id)
    }
    const invitations = () => testDb()('outbox').whereIn('visit_id', ids).where({ kind: 'invitation', channel: 'sms' })
    await expect.poll(async () => (await invitations()).every((row) => row.state === 'sent'), { timeout: 30_000, interval: 200 }).toBe(true)
    await Promise.all(pair.map((server) => server.stop()))
    for (const number of annex.numbers) {
      expect((await fakeMessages(number)).filter((message) => /is booked/.test(message.body))).toHaveLength(1)
    }
  })
})
