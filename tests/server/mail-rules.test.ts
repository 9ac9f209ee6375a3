// Issue 15 §1: every kind of patient message (invitation, update, length change, cancellation,
// reminder) as it arrives over real SMTP in the catcher, read with mailparser and ical.js, checked
// against the rule it must keep, with the RFC section beside each check. Own test annexes, so any
// weeks (2–6 here).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type ICAL from 'ical.js'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { bookingFor, createMailAnnex, outboxRowsOf, type MailAnnex } from '../helpers/mail-fixtures'
import { calendarMethodParam, calendarPart, jsonOf, parseCalendar, pollUntil, veventOf, waitForOutboxMail, type Arrived } from '../helpers/mail'
import { atAhead, MONDAY, TUESDAY, WEDNESDAY } from '../helpers/dates'

const ZONE = 'America/Los_Angeles'
// RFC 5545 §3.2 / RFC 6868: a name with every character that troubles a parameter value.
const FIRST = 'Zoë "Annie"'
const LAST = 'O\'Brien; Ruiz, Dr: 李 \\ 🦷'
const FULL = `${FIRST} ${LAST}`

let manager: ApiClient
let annex: MailAnnex

beforeAll(async () => {
  manager = await signedInAs('manager@fernhollow.test')
  annex = await createMailAnnex({ patients: 4 })
  await testDb()('patients').where({ id: annex.patientIds[0] }).update({ first_name: FIRST, last_name: LAST })
})
afterAll(closeTestDb)

async function rowOf(visitId: number, kind: string) {
  const rows = await pollUntil(() => outboxRowsOf(visitId), (found) => found.some((row) => row.kind === kind))
  return rows.filter((row) => row.kind === kind).at(-1)!
}

async function arrived(visitId: number, kind: string, email: string): Promise<Arrived> {
  return waitForOutboxMail(email, (await rowOf(visitId, kind)).id)
}

/** Sends a visit's next queued reminder now. */
async function reminderNow(visitId: number, email: string): Promise<Arrived> {
  const row = (await outboxRowsOf(visitId)).find((found) => found.kind === 'reminder' && found.state === 'queued')
  expect(row).toBeDefined()
  await testDb()('outbox').where({ id: row!.id }).update({ due_at: new Date() })
  return waitForOutboxMail(email, row!.id)
}

/** The raw calendar part's lines as octets (what RFC 5545 §3.1 counts). */
function calendarOctetLines(mail: Arrived): Buffer[] {
  const bytes = calendarPart(mail).content
  const lines: Buffer[] = []
  let start = 0
  for (let at = 0; at < bytes.length - 1; at += 1) {
    if (bytes[at] === 0x0d && bytes[at + 1] === 0x0a) {
      lines.push(bytes.subarray(start, at))
      start = at + 2
    }
  }
  return lines
}

/** A header as sent, unfolded (RFC 5322 §2.2.3); mailparser turns List-* headers into objects. */
function rawHeader(mail: Arrived, name: string): string {
  const head = mail.raw.split(/\r?\n\r?\n/)[0]!.replace(/\r?\n[ \t]+/g, ' ')
  const line = head.split(/\r?\n/).find((found) => found.toLowerCase().startsWith(`${name.toLowerCase()}:`))
  return line ? line.slice(name.length + 1).trim() : ''
}

function calendarPartsIn(mail: Arrived): number {
  // RFC 6047 §2.4: one text/calendar part; no second copy as application/ics or a .ics attachment.
  return (mail.raw.match(/^Content-Type:\s*(?:text\/calendar|application\/ics)/gim) ?? []).length
}

function expectCommonHeaders(mail: Arrived): void {
  // RFC 3834 §5: messages sent by a program say so.
  expect(mail.parsed.headers.get('auto-submitted')).toBe('auto-generated')
  // Internal tracing stays in the database, not in what patients receive (common practice, no source).
  expect([...mail.parsed.headers.keys()].filter((name) => name.startsWith('x-cuspline'))).toEqual([])
  // RFC 5322 §3.6.4: a Message-ID unique worldwide: the row id plus a random part.
  expect(mail.parsed.messageId).toMatch(/^<\d+\.[0-9a-f]{24}@[A-Za-z0-9.-]+>$/)
}

function expectPhoneHtml(mail: Arrived): void {
  const html = String(mail.parsed.html)
  // Mobile browsers lay a page without a viewport out at 980 px (common practice, no source).
  expect(html).toMatch(/<meta name="viewport" content="width=device-width, initial-scale=1">/)
  expect(html).toMatch(/data-part="site"[^>]*>Test annex/)
  expect(html).toMatch(/data-part="footer"[\s\S]*You got this (e-mail|reminder) because/)
  expect(html).toContain(annex.phone)
}

describe('an invitation for a patient whose name has ", ;, ,, :, \\, non-ASCII and an emoji', () => {
  let visitId: number
  let mail: Arrived

  beforeAll(async () => {
    const booked = await manager.post('/api/visits', bookingFor(annex, 0, atAhead(2, MONDAY, '10:00', ZONE)))
    expect(booked.status).toBe(201)
    visitId = booked.body.id
    mail = await arrived(visitId, 'invitation', annex.emails[0]!)
  })

  it('carries exactly one calendar part, text/calendar with method=REQUEST (RFC 6047 §2.4; RFC 5545 §8.1)', () => {
    expect(calendarPartsIn(mail)).toBe(1)
    expect(mail.parsed.attachments).toHaveLength(1)
    expect(calendarPart(mail).contentType).toBe('text/calendar')
    expect(calendarMethodParam(mail)).toBe('REQUEST')
    expect(parseCalendar(calendarPart(mail).content.toString('utf8')).getFirstPropertyValue('method')).toBe('REQUEST')
  })

  it('keeps the name whole in ATTENDEE;CN (RFC 5545 §3.2, RFC 6868 §3: " as ^\')', () => {
    const text = calendarPart(mail).content.toString('utf8')
    const unfolded = text.replace(/\r\n /g, '')
    const attendeeLine = unfolded.split('\r\n').find((line) => line.startsWith('ATTENDEE'))!
    // No double quote inside the value: only the two that enclose it.
    expect(/CN="([^"]*)"/.exec(attendeeLine)?.[1]).toContain("^'Annie^'")
    const attendee = veventOf(parseCalendar(text)).getFirstProperty('attendee')!
    expect(attendee.getParameter('cn')).toBe(FULL)
    expect(String(attendee.getFirstValue()).toLowerCase()).toBe(`mailto:${annex.emails[0]}`)
    // RFC 5546 §3.2.2: the REQUEST asks the attendee for a reply.
    expect(attendee.getParameter('rsvp')).toBe('TRUE')
    expect(attendee.getParameter('partstat')).toBe('NEEDS-ACTION')
  })

  it('folds lines at 75 octets without splitting a UTF-8 sequence (RFC 5545 §3.1)', () => {
    const lines = calendarOctetLines(mail)
    expect(lines.length).toBeGreaterThan(10)
    for (const line of lines) {
      expect(line.length).toBeLessThanOrEqual(75)
      expect(line.toString('utf8')).not.toContain('\uFFFD')
    }
    // The non-ASCII name made at least one fold.
    expect(lines.some((line) => line[0] === 0x20)).toBe(true)
  })

  it('names the site\'s reply address as ORGANIZER (RFC 5546 §3.2.3: replies go to the ORGANIZER)', () => {
    const organizer = veventOf(parseCalendar(calendarPart(mail).content.toString('utf8'))).getFirstProperty('organizer')!
    expect(String(organizer.getFirstValue()).toLowerCase()).toBe(`mailto:replies+${annex.siteId}@cuspline.test`)
    expect(organizer.getParameter('cn')).toMatch(/^Test annex/)
  })

  it('runs the event from seating to dismissal, the same span in the text, the HTML, the visit page and the .ics download', async () => {
    const row = await testDb()('visits').where({ id: visitId }).first()
    const plan = jsonOf(row.plan) as unknown as { segments: Array<{ kind: string; startMinute: number }> }
    const last = plan.segments.at(-1)!
    // This template ends with a room reset: the chair is held longer than the patient stays.
    expect(last.kind).toBe('reset')
    const patientEndMs = row.start_utc.getTime() + last.startMinute * 60_000
    expect(patientEndMs).toBeLessThan(row.end_utc.getTime())

    const vevent = veventOf(parseCalendar(calendarPart(mail).content.toString('utf8')))
    // RFC 5545 §3.8.2.2: DTEND is when the event (the patient's visit) ends.
    expect((vevent.getFirstPropertyValue('dtend') as ICAL.Time).toJSDate().getTime()).toBe(patientEndMs)
    const minutes = last.startMinute
    const words = `about ${[Math.floor(minutes / 60) ? `${Math.floor(minutes / 60)} hour${Math.floor(minutes / 60) === 1 ? '' : 's'}` : '', minutes % 60 ? `${minutes % 60} minutes` : ''].filter(Boolean).join(' ')}`
    expect(mail.parsed.text).toContain(`Plan for: ${words}`)
    expect(String(mail.parsed.html)).toContain(words)

    const token = decodeURIComponent(new URL(/https?:\/\/\S+\/visit\/[^\s?]+/.exec(mail.parsed.text ?? '')![0]).pathname.split('/').pop()!)
    const page = await new ApiClient().get(`/api/visit/${encodeURIComponent(token)}`)
    expect(page.body.minutes).toBe(minutes)
    expect(new Date(page.body.endUtc).getTime()).toBe(patientEndMs)
    const download = await fetch(new URL(`/api/visits/${visitId}/ics?token=${encodeURIComponent(token)}`, manager.baseURL))
    const downloaded = veventOf(parseCalendar(await download.text()))
    expect((downloaded.getFirstPropertyValue('dtend') as ICAL.Time).toJSDate().getTime()).toBe(patientEndMs)
    expect(downloaded.getFirstProperty('attendee')!.getParameter('cn')).toBe(FULL)
  })

  it('gives Confirm and Ask to cancel links of their own, and keeps the .ics link (common practice, no source)', () => {
    const text = mail.parsed.text ?? ''
    expect(text).toMatch(/Confirm you are coming: https?:\/\/\S+\/visit\/\S+\?do=confirm/)
    expect(text).toMatch(/Ask us to cancel: https?:\/\/\S+\/visit\/\S+\?do=cancel/)
    expect(text).toMatch(/Add it to your calendar \(\.ics\): https?:\/\/\S+\/ics\?token=/)
    expect(text).not.toContain('Confirm or ask to cancel')
    expect(String(mail.parsed.html)).toContain('Confirm I am coming')
    expect(String(mail.parsed.html)).toContain('Ask to cancel')
  })

  it('says it was sent by a program, carries no internal headers, and has a random Message-ID (RFC 3834 §5, RFC 5322 §3.6.4)', () => {
    expectCommonHeaders(mail)
    // RFC 8058 is for reminders only: the invitation is a message the patient needs.
    expect(rawHeader(mail, 'List-Unsubscribe')).toBe('')
  })

  it('reads on a phone: viewport, site name at the top, a footer saying why and how to reach the site', () => {
    expectPhoneHtml(mail)
  })
})

describe('updates', () => {
  it('says the time changed when the visit moves (RFC 5546 §2.1.4: same UID, higher SEQUENCE)', async () => {
    const booked = await manager.post('/api/visits', bookingFor(annex, 1, atAhead(3, MONDAY, '10:00', ZONE)))
    await arrived(booked.body.id, 'invitation', annex.emails[1]!)
    const visit = await manager.get(`/api/visits/${booked.body.id}`)
    expect((await manager.patch(`/api/visits/${booked.body.id}`, { rowVersion: visit.body.rowVersion, startUtc: atAhead(3, TUESDAY, '13:00', ZONE) })).status).toBe(200)
    const update = await arrived(booked.body.id, 'update', annex.emails[1]!)
    expect(update.parsed.text).toMatch(/has a new time: Tuesday/)
    expect(calendarPartsIn(update)).toBe(1)
    expect(calendarMethodParam(update)).toBe('REQUEST')
    const vevent = veventOf(parseCalendar(calendarPart(update).content.toString('utf8')))
    expect(vevent.getFirstPropertyValue('uid')).toBe(booked.body.icalUid)
    expect(Number(vevent.getFirstPropertyValue('sequence'))).toBe(1)
    expectCommonHeaders(update)
  })

  it('says in words that only the length changed, and sends nothing for a change of the room reset alone', async () => {
    const booked = await manager.post('/api/visits', bookingFor(annex, 2, atAhead(4, MONDAY, '10:00', ZONE)))
    await arrived(booked.body.id, 'invitation', annex.emails[2]!)
    let visit = await manager.get(`/api/visits/${booked.body.id}`)
    // A longer reset only (the length set by hand grows the room reset): the patient sees nothing new.
    const longer = await manager.patch(`/api/visits/${booked.body.id}`, { rowVersion: visit.body.rowVersion, lengthOverride: { chairMinutes: visit.body.plan.chairMinutes + visit.body.plan.unitMinutes, reason: 'Deep clean of the room' } })
    expect(longer.status).toBe(200)
    expect((await outboxRowsOf(booked.body.id)).filter((row) => row.kind === 'update')).toHaveLength(0)
    // Reminders planned for the same start stay as they were.
    expect((await outboxRowsOf(booked.body.id)).filter((row) => row.kind === 'reminder' && row.state === 'queued')).toHaveLength(2)

    visit = await manager.get(`/api/visits/${booked.body.id}`)
    const before = (await testDb()('visits').where({ id: booked.body.id }).first()).start_utc.getTime()
    const replanned = await manager.patch(`/api/visits/${booked.body.id}`, {
      rowVersion: visit.body.rowVersion,
      items: [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }, { templateCode: 'COMP-POST', tooth: '18', surfaces: 'O' }],
    })
    expect(replanned.status).toBe(200)
    const update = await arrived(booked.body.id, 'update', annex.emails[2]!)
    expect((await testDb()('visits').where({ id: booked.body.id }).first()).start_utc.getTime()).toBe(before)
    expect(update.parsed.text).toMatch(/will take about .+ instead of about .+\. The time is the same\./)
    expect(update.parsed.text).not.toMatch(/time or place/)
  })
})

describe('reminders', () => {
  let visitId: number
  let reminder: Arrived

  beforeAll(async () => {
    const booked = await manager.post('/api/visits', bookingFor(annex, 3, atAhead(5, WEDNESDAY, '10:00', ZONE)))
    visitId = booked.body.id
    await arrived(visitId, 'invitation', annex.emails[3]!)
    reminder = await reminderNow(visitId, annex.emails[3]!)
  })

  it('is a plain message with no calendar part (RFC 5546 §3.2.2: a REQUEST would ask for a reply again)', () => {
    expect(calendarPartsIn(reminder)).toBe(0)
    expect(reminder.parsed.attachments).toHaveLength(0)
    expect(reminder.parsed.subject).toMatch(/^Reminder:/)
    expect(reminder.parsed.text).toMatch(/When: /)
    expect(reminder.parsed.text).toMatch(/Add it to your calendar \(\.ics\): /)
    expectCommonHeaders(reminder)
    expectPhoneHtml(reminder)
  })

  it('offers a one-click stop (RFC 8058 §3.1: List-Unsubscribe with an https/http URI and List-Unsubscribe-Post) and a visible link', () => {
    const header = rawHeader(reminder, 'List-Unsubscribe')
    expect(header).toMatch(/^<https?:\/\/\S+\/api\/visit\/\S+\/reminders-off>$/)
    expect(rawHeader(reminder, 'List-Unsubscribe-Post')).toBe('List-Unsubscribe=One-Click')
    expect(reminder.parsed.text).toMatch(/Stop reminders by e-mail .*: https?:\/\/\S+\?do=stop-reminders/)
    expect(String(reminder.parsed.html)).toContain('Stop reminders by e-mail')
  })

  it('does not ask a confirmed patient to confirm again', async () => {
    expect(reminder.parsed.text).toMatch(/Confirm you are coming/)
    await testDb()('visits').where({ id: visitId }).update({ state: 'confirmed' })
    const second = await reminderNow(visitId, annex.emails[3]!)
    expect(second.parsed.text).not.toMatch(/Confirm/)
    expect(second.parsed.text).toContain('You have confirmed this visit')
    expect(second.parsed.text).toMatch(/Ask us to cancel: /)
  })

  it('one-click POST turns reminders off, with an audit row; the cancellation still comes (RFC 8058 §3.2)', async () => {
    const url = /^<(.+)>$/.exec(rawHeader(reminder, 'List-Unsubscribe'))![1]!
    // As a mail client sends it: a form body, no cookie, no Origin.
    const response = await fetch(url, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'List-Unsubscribe=One-Click' })
    expect(response.status).toBe(200)
    const patient = await testDb()('patients').where({ id: annex.patientIds[3] }).first()
    expect(patient.reminders_off_at).not.toBeNull()
    const audit = await testDb()('audit_log').where({ action: 'patient_reminders_off', entity: 'patient', entity_id: String(annex.patientIds[3]) })
    expect(audit).toHaveLength(1)
    expect(jsonOf(audit[0].after)).toMatchObject({ by: 'one-click unsubscribe' })
    // A second click changes nothing and writes nothing more.
    expect((await fetch(url, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'List-Unsubscribe=One-Click' })).status).toBe(200)
    expect(await testDb()('audit_log').where({ action: 'patient_reminders_off', entity_id: String(annex.patientIds[3]) })).toHaveLength(1)

    // A reminder now due is skipped; a cancellation is sent.
    const queued = (await outboxRowsOf(visitId)).find((row) => row.kind === 'reminder' && row.state === 'queued')
    if (queued) {
      await testDb()('outbox').where({ id: queued.id }).update({ due_at: new Date() })
      await expect.poll(async () => (await testDb()('outbox').where({ id: queued.id }).first()).last_error, { timeout: 15_000 }).toBe('the patient turned reminders off')
    }
    expect((await manager.post(`/api/visits/${visitId}/cancel`, { reason: 'Clinic closed that day' })).status).toBe(200)
    const cancellation = await arrived(visitId, 'cancellation', annex.emails[3]!)
    expect(calendarPartsIn(cancellation)).toBe(1)
    expect(calendarMethodParam(cancellation)).toBe('CANCEL')
    // RFC 5546 §3.2.5: CANCEL with the same UID, STATUS:CANCELLED, no VALARM.
    const vevent = veventOf(parseCalendar(calendarPart(cancellation).content.toString('utf8')))
    expect(vevent.getFirstPropertyValue('status')).toBe('CANCELLED')
    expect(vevent.getAllSubcomponents('valarm')).toHaveLength(0)
    expectCommonHeaders(cancellation)
    expectPhoneHtml(cancellation)
    expect(rawHeader(cancellation, 'List-Unsubscribe')).toBe('')
  })

  it('refuses a forged unsubscribe link (404) and any other form post (415)', async () => {
    const forged = await fetch(new URL('/api/visit/1.9999999999999.AAAA/reminders-off', manager.baseURL), { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'List-Unsubscribe=One-Click' })
    expect(forged.status).toBe(404)
    const elsewhere = await fetch(new URL('/api/visit/1.9999999999999.AAAA/cancel', manager.baseURL), { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: 'reason=x' })
    expect(elsewhere.status).toBe(415)
  })
})

describe('asking to cancel from the link', () => {
  it('records the optional reason with the request', async () => {
    const own = await createMailAnnex({ patients: 1 })
    const booked = await manager.post('/api/visits', bookingFor(own, 0, atAhead(6, MONDAY, '10:00', ZONE)))
    const mail = await arrived(booked.body.id, 'invitation', own.emails[0]!)
    const cancelLink = /Ask us to cancel: (\S+)/.exec(mail.parsed.text ?? '')![1]!
    const token = decodeURIComponent(new URL(cancelLink).pathname.split('/').pop()!)
    const tooLong = await new ApiClient().post(`/api/visit/${encodeURIComponent(token)}/cancel`, { reason: 'x'.repeat(301) })
    expect(tooLong.status).toBe(400)
    const asked = await new ApiClient().post(`/api/visit/${encodeURIComponent(token)}/cancel`, { reason: 'Away for work' })
    expect(asked.status).toBe(200)
    expect(asked.body.cancelRequested).toBe(true)
    const [audit] = await testDb()('audit_log').where({ action: 'visit_cancel_requested', entity_id: String(booked.body.id) })
    expect(jsonOf(audit.after)).toMatchObject({ by: 'patient link', note: 'Away for work' })
  })
})
