// Issue 15 §2: a patient presses Accept, Decline or Maybe in their own calendar; the client mails an
// iTIP REPLY (RFC 5546 §3.2.3) to the event's ORGANIZER, the site's reply address. Here a fake
// calendar client writes REPLYs as real ones do (parameters in varied order, folded lines,
// quoted-printable and base64 bodies) and sends them over SMTP (nodemailer) to the real mail catcher
// script, which posts each to the app's inbound endpoint, signed. Own test annexes (weeks 7–9).
import { spawn, type ChildProcess } from 'node:child_process'
import { mkdtempSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { createHmac, randomUUID } from 'node:crypto'
import net from 'node:net'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import nodemailer, { type Transporter } from 'nodemailer'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { freePort } from '../helpers/app-server'
import { bookingFor, createMailAnnex, outboxRowsOf, type MailAnnex } from '../helpers/mail-fixtures'
import { calendarPart, jsonOf, parseCalendar, pollUntil, veventOf, waitForOutboxMail } from '../helpers/mail'
import { atAhead, MONDAY, TUESDAY, WEDNESDAY } from '../helpers/dates'

const ZONE = 'America/Los_Angeles'
const SECRET = process.env.NUXT_MAIL_INBOUND_SECRET ?? ''
let manager: ApiClient
let annex: MailAnnex
let catcher: ChildProcess
let smtp: Transporter

async function portOpen(port: number): Promise<boolean> {
  return new Promise((done) => {
    const socket = net.connect(port, '127.0.0.1')
    socket.once('connect', () => { socket.end(); done(true) })
    socket.once('error', () => done(false))
  })
}

beforeAll(async () => {
  expect(SECRET.length).toBeGreaterThanOrEqual(32)
  manager = await signedInAs('manager@fernhollow.test')
  annex = await createMailAnnex({ patients: 5 })
  // The real catcher script, on a port of its own, posting to this suite's app server.
  const port = await freePort()
  catcher = spawn('node_modules/.bin/tsx', ['scripts/mail-catcher.ts'], {
    env: { ...process.env, SMTP_PORT: String(port), MAIL_DIR: mkdtempSync(join(tmpdir(), 'cuspline-replies-')), INBOUND_MAIL_URL: `${manager.baseURL}/api/inbound/mail`, NUXT_MAIL_INBOUND_SECRET: SECRET },
    stdio: 'ignore',
  })
  await pollUntil(() => portOpen(port), Boolean)
  smtp = nodemailer.createTransport({ host: '127.0.0.1', port, secure: false, ignoreTLS: true })
})

afterAll(async () => {
  smtp?.close()
  if (catcher?.pid) catcher.kill('SIGTERM')
  await closeTestDb()
})

interface Invited {
  visitId: number
  uid: string
  sequence: number
  organizer: string
  attendee: string
}

async function bookAndInvite(patient: number, startUtc: string): Promise<Invited> {
  const booked = await manager.post('/api/visits', bookingFor(annex, patient, startUtc))
  expect(booked.status).toBe(201)
  const rows = await pollUntil(() => outboxRowsOf(booked.body.id), (found) => found.some((row) => row.kind === 'invitation'))
  const row = rows.find((found) => found.kind === 'invitation')!
  const mail = await waitForOutboxMail(annex.emails[patient]!, row.id)
  const vevent = veventOf(parseCalendar(calendarPart(mail).content.toString('utf8')))
  return {
    visitId: booked.body.id, uid: String(vevent.getFirstPropertyValue('uid')), sequence: Number(vevent.getFirstPropertyValue('sequence')),
    organizer: String(vevent.getFirstPropertyValue('organizer')).replace(/^mailto:/i, ''), attendee: annex.emails[patient]!,
  }
}

/** A REPLY as a client writes it; `style` varies the parameter order, folding and quoting. */
function replyCalendar(invited: Invited, partstat: string, style: 'apple' | 'outlook' | 'google', sequence = invited.sequence, uid = invited.uid): string {
  const stamp = new Date().toISOString().replace(/[-:]/g, '').replace(/\.\d{3}/, '')
  const attendee = {
    // CN first, EMAIL parameter, folded mid-parameter (RFC 5545 §3.1 allows a fold anywhere).
    apple: `ATTENDEE;CN="Patient, Test";CUTYPE=INDIVIDUAL;EMAIL=${invited.attendee};PARTSTAT=${partstat}:\r\n mailto:${invited.attendee}`,
    // PARTSTAT first, upper-case MAILTO, RSVP=FALSE.
    outlook: `ATTENDEE;PARTSTAT=${partstat};RSVP=FALSE;CN=Patient Test:MAILTO:${invited.attendee}`,
    // ROLE and a long CN folded across lines.
    google: `ATTENDEE;CUTYPE=INDIVIDUAL;ROLE=REQ-PARTICIPANT;PARTSTAT=${partstat};CN=${invited.attendee};X-NUM-GU\r\n ESTS=0:mailto:${invited.attendee}`,
  }[style]
  return [
    'BEGIN:VCALENDAR', `PRODID:-//Fake ${style} calendar//EN`, 'VERSION:2.0', 'METHOD:REPLY', 'BEGIN:VEVENT',
    `DTSTAMP:${stamp}`, `SEQUENCE:${sequence}`, `UID:${uid}`, `ORGANIZER;CN=Test annex:mailto:${invited.organizer}`, attendee,
    style === 'outlook' ? `SUMMARY;LANGUAGE=en-US:${partstat === 'DECLINED' ? 'Declined' : 'Accepted'}: Dental visit at Test annex — ` : 'SUMMARY:Dental visit',
    'END:VEVENT', 'END:VCALENDAR', '',
  ].join('\r\n')
}

async function sendReply(invited: Invited, calendar: string, encoding: 'quoted-printable' | 'base64' | '7bit-with-ics-attachment'): Promise<void> {
  const common = { from: invited.attendee, to: invited.organizer, subject: 'Reply: Dental visit at Test annex', text: 'The patient answered the invitation.' }
  if (encoding === '7bit-with-ics-attachment') {
    // Google style: the REPLY inline, plus the same as an invite.ics attachment (base64).
    await smtp.sendMail({
      ...common,
      alternatives: [{ contentType: 'text/calendar; charset=UTF-8; method=REPLY', content: calendar, contentTransferEncoding: '7bit' }],
      attachments: [{ filename: 'invite.ics', contentType: 'application/ics; name="invite.ics"', content: calendar, contentTransferEncoding: 'base64' }],
    })
    return
  }
  await smtp.sendMail({ ...common, alternatives: [{ contentType: 'text/calendar; method=REPLY; charset="utf-8"', content: calendar, contentTransferEncoding: encoding }] })
}

async function inboundOf(visitId: number) {
  return testDb()('inbound_mail').where({ visit_id: visitId }).orderBy('id')
}

describe('replies from the patient\'s calendar', () => {
  it('Accept (quoted-printable, Apple-style parameters) confirms the visit, with an audit row', async () => {
    const invited = await bookAndInvite(0, atAhead(7, MONDAY, '10:00', ZONE))
    await sendReply(invited, replyCalendar(invited, 'ACCEPTED', 'apple'), 'quoted-printable')
    await expect.poll(async () => (await testDb()('visits').where({ id: invited.visitId }).first()).state, { timeout: 20_000, interval: 200 }).toBe('confirmed')
    const [audit] = await testDb()('audit_log').where({ action: 'visit_confirmed', entity: 'visit', entity_id: String(invited.visitId) })
    expect(jsonOf(audit.after)).toMatchObject({ by: 'calendar reply', partstat: 'ACCEPTED' })
    expect((await inboundOf(invited.visitId)).map((row) => row.outcome)).toEqual(['matched'])
  })

  it('Decline (base64, Outlook-style parameters) creates a cancel request exactly as from the link', async () => {
    const invited = await bookAndInvite(1, atAhead(7, TUESDAY, '10:00', ZONE))
    await sendReply(invited, replyCalendar(invited, 'DECLINED', 'outlook'), 'base64')
    await expect.poll(async () => (await testDb()('visits').where({ id: invited.visitId }).first()).cancel_requested_at, { timeout: 20_000, interval: 200 }).not.toBeNull()
    const row = await testDb()('visits').where({ id: invited.visitId }).first()
    // The site's policy is 'request' (default): the front desk decides, the visit stands.
    expect(row.state).toBe('booked')
    const [audit] = await testDb()('audit_log').where({ action: 'visit_cancel_requested', entity_id: String(invited.visitId) })
    expect(jsonOf(audit.after)).toMatchObject({ by: 'calendar reply' })
    const requests = await manager.get(`/api/outbox/cancel-requests?siteId=${annex.siteId}`)
    expect(requests.body.map((request: { visitId: number }) => request.visitId)).toContain(invited.visitId)
  })

  it('Maybe (7bit with an .ics attachment, Google-style) is noted; nothing else changes', async () => {
    const invited = await bookAndInvite(2, atAhead(7, WEDNESDAY, '10:00', ZONE))
    await sendReply(invited, replyCalendar(invited, 'TENTATIVE', 'google'), '7bit-with-ics-attachment')
    await expect.poll(async () => (await testDb()('audit_log').where({ action: 'visit_reply_tentative', entity_id: String(invited.visitId) })).length, { timeout: 20_000, interval: 200 }).toBe(1)
    expect((await testDb()('visits').where({ id: invited.visitId }).first()).state).toBe('booked')
  })

  it('ignores an answer to an older SEQUENCE (RFC 5546 §2.1.5)', async () => {
    const invited = await bookAndInvite(3, atAhead(8, MONDAY, '10:00', ZONE))
    const visit = await manager.get(`/api/visits/${invited.visitId}`)
    expect((await manager.patch(`/api/visits/${invited.visitId}`, { rowVersion: visit.body.rowVersion, startUtc: atAhead(8, TUESDAY, '11:00', ZONE) })).status).toBe(200)
    // The patient answers the first invitation (SEQUENCE 0) after the move (SEQUENCE 1).
    await sendReply(invited, replyCalendar(invited, 'ACCEPTED', 'outlook', 0), 'base64')
    await expect.poll(async () => (await inboundOf(invited.visitId)).length, { timeout: 20_000, interval: 200 }).toBe(1)
    expect((await inboundOf(invited.visitId))[0]).toMatchObject({ outcome: 'ignored', partstat: 'ACCEPTED' })
    expect((await testDb()('visits').where({ id: invited.visitId }).first()).state).toBe('booked')
  })

  it('keeps a reply that matches no visit and lists it on the Outbox', async () => {
    const invited = await bookAndInvite(4, atAhead(9, MONDAY, '10:00', ZONE))
    const stranger = `nobody-${randomUUID()}@elsewhere.test`
    await sendReply({ ...invited, attendee: stranger }, replyCalendar({ ...invited, attendee: stranger }, 'ACCEPTED', 'apple'), 'quoted-printable')
    await expect.poll(async () => (await testDb()('inbound_mail').where({ sender: stranger })).length, { timeout: 20_000, interval: 200 }).toBe(1)
    const [kept] = await testDb()('inbound_mail').where({ sender: stranger })
    expect(kept).toMatchObject({ outcome: 'unmatched', site_id: annex.siteId })
    expect(kept.note).toMatch(/not the visit's patient/)
    expect((await testDb()('visits').where({ id: invited.visitId }).first()).state).toBe('booked')
    const listed = await manager.get(`/api/outbox/unmatched-replies?siteId=${annex.siteId}`)
    expect(listed.status).toBe(200)
    expect(listed.body.map((reply: { sender: string }) => reply.sender)).toContain(stranger)
    expect((await (await signedInAs('desk.aspen@fernhollow.test')).get(`/api/outbox/unmatched-replies?siteId=${annex.siteId}`)).status).toBe(403)
    expect((await new ApiClient().get('/api/outbox/unmatched-replies')).status).toBe(401)
  })
})

describe('the inbound endpoint', () => {
  function signed(body: string, id = randomUUID(), timestamp = String(Math.floor(Date.now() / 1000)), secret = SECRET) {
    const signature = createHmac('sha256', secret).update(`${id}.${timestamp}.`).update(Buffer.from(body)).digest('hex')
    return { 'content-type': 'message/rfc822', 'x-cuspline-inbound-id': id, 'x-cuspline-inbound-timestamp': timestamp, 'x-cuspline-inbound-signature': signature }
  }
  const post = (headers: Record<string, string>, body: string) => fetch(`${manager.baseURL}/api/inbound/mail`, { method: 'POST', headers, body })

  it('refuses unsigned, forged, old and replayed posts with 401, and changes nothing', async () => {
    const invited = await bookAndInvite(4, atAhead(9, TUESDAY, '10:00', ZONE))
    const raw = [
      `From: ${invited.attendee}`, `To: ${invited.organizer}`, 'Subject: Accepted', 'MIME-Version: 1.0',
      'Content-Type: text/calendar; method=REPLY; charset=utf-8', '', replyCalendar(invited, 'ACCEPTED', 'outlook'),
    ].join('\r\n')
    const before = await testDb()('inbound_mail').count({ n: '*' }).first()
    expect((await post({ 'content-type': 'message/rfc822' }, raw)).status).toBe(401)
    expect((await post(signed(raw, randomUUID(), undefined, 'x'.repeat(48)), raw)).status).toBe(401)
    // Signed for another body (the PARTSTAT edited after signing).
    expect((await post(signed(raw), raw.replace('PARTSTAT=ACCEPTED', 'PARTSTAT=DECLINED'))).status).toBe(401)
    // Ten minutes old (outside the five-minute window).
    expect((await post(signed(raw, randomUUID(), String(Math.floor(Date.now() / 1000) - 600)), raw)).status).toBe(401)
    expect(await testDb()('inbound_mail').count({ n: '*' }).first()).toEqual(before)
    expect((await testDb()('visits').where({ id: invited.visitId }).first()).state).toBe('booked')

    // Properly signed: accepted once; the same delivery again is a replay.
    const headers = signed(raw)
    const first = await post(headers, raw)
    expect(first.status).toBe(200)
    expect((await first.json()).outcome).toBe('matched')
    expect((await testDb()('visits').where({ id: invited.visitId }).first()).state).toBe('confirmed')
    await testDb()('visits').where({ id: invited.visitId }).update({ state: 'booked' })
    expect((await post(headers, raw)).status).toBe(401)
    expect((await testDb()('visits').where({ id: invited.visitId }).first()).state).toBe('booked')
  })

  it('keeps a signed post without a calendar REPLY as unmatched', async () => {
    const raw = ['From: someone@elsewhere.test', 'To: replies+1@cuspline.test', `Subject: Question ${randomUUID()}`, '', 'Can I come earlier?'].join('\r\n')
    const response = await post(signed(raw), raw)
    expect(response.status).toBe(200)
    expect(await response.json()).toMatchObject({ outcome: 'unmatched', note: expect.stringMatching(/no calendar part/) })
  })
})
