// Patient e-mails end to end: booked, moved and cancelled visits go through the outbox and the real
// SMTP catcher; what arrived is parsed with mailparser and its calendar part with ical.js.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { bookingFor, createMailAnnex, outboxRowsOf, type MailAnnex } from '../helpers/mail-fixtures'
import { calendarMethodParam, calendarPart, parseCalendar, veventOf, visitLinkOf, waitForOutboxMail, type Arrived } from '../helpers/mail'
import { signVisitToken } from '../../server/utils/visit-token'
import { atAhead, MONDAY, TUESDAY } from '../helpers/dates'

const ZONE = 'America/Los_Angeles'
let manager: ApiClient
let annex: MailAnnex

beforeAll(async () => {
  manager = await signedInAs('manager@fernhollow.test')
  annex = await createMailAnnex({ patients: 6 })
})
afterAll(closeTestDb)

async function outboxRow(visitId: number, kind: string) {
  const rows = (await outboxRowsOf(visitId)).filter((row) => row.kind === kind)
  expect(rows.length).toBeGreaterThan(0)
  return rows.at(-1)!
}

async function arrived(visitId: number, kind: string, email: string): Promise<Arrived> {
  const row = await outboxRow(visitId, kind)
  return waitForOutboxMail(email, row.id)
}

function calendarOf(mail: Arrived) {
  return parseCalendar(calendarPart(mail).content.toString('utf8'))
}

const everything = (mail: Arrived) => [mail.parsed.subject, mail.parsed.text, mail.parsed.html, calendarPart(mail).content.toString('utf8')].join('\n')

describe('invitation, update and cancellation', () => {
  let visitId: number
  let uid: string
  let invitation: Arrived

  it('sends an invitation whose calendar part is a METHOD:REQUEST event for the booked chair time', async () => {
    const startUtc = atAhead(2, MONDAY, '10:00', ZONE)
    const booked = await manager.post('/api/visits', bookingFor(annex, 0, startUtc))
    expect(booked.status).toBe(201)
    visitId = booked.body.id
    uid = booked.body.icalUid
    invitation = await arrived(visitId, 'invitation', annex.emails[0]!)

    // RFC 6047 §2.4: the part is text/calendar with a method parameter equal to METHOD.
    expect(calendarPart(invitation).contentType).toBe('text/calendar')
    expect(calendarMethodParam(invitation)).toBe('REQUEST')
    const calendar = calendarOf(invitation)
    expect(calendar.getFirstPropertyValue('method')).toBe('REQUEST')
    const vevent = veventOf(calendar)
    // RFC 5545 §3.6.1: exactly one UID and one DTSTAMP; §3.8.7.2: DTSTAMP in UTC.
    expect(vevent.getAllProperties('uid')).toHaveLength(1)
    expect(vevent.getFirstPropertyValue('uid')).toBe(uid)
    expect(vevent.getAllProperties('dtstamp')).toHaveLength(1)
    expect(String(vevent.getFirstProperty('dtstamp')!.toICALString())).toMatch(/^DTSTAMP:\d{8}T\d{6}Z$/)
    // RFC 5545 §3.6.1: DTEND and DURATION never both.
    expect(vevent.hasProperty('dtend') && vevent.hasProperty('duration')).toBe(false)
    // RFC 5546 §3.2.2: ORGANIZER and at least one ATTENDEE.
    expect(String(vevent.getFirstPropertyValue('organizer')).toLowerCase()).toBe(`mailto:${annex.siteEmail}`)
    expect(vevent.getAllProperties('attendee').map((attendee) => String(attendee.getFirstValue()).toLowerCase())).toContain(`mailto:${annex.emails[0]}`)
    // DTSTART is the visit's UTC start (UTC form, so no VTIMEZONE is needed; RFC 5546 §3.2.2).
    const row = await testDb()('visits').where({ id: visitId }).first()
    const dtstart = vevent.getFirstPropertyValue('dtstart') as { toJSDate: () => Date }
    expect(dtstart.toJSDate().toISOString()).toBe(row.start_utc.toISOString())
    expect(vevent.getFirstProperty('dtstart')!.toICALString()).toMatch(/^DTSTART:\d{8}T\d{6}Z$/)
    expect((vevent.getFirstPropertyValue('dtend') as { toJSDate: () => Date }).toJSDate().toISOString()).toBe(row.end_utc.toISOString())
    expect(String(vevent.getFirstPropertyValue('location'))).toContain(annex.address)
    expect(vevent.getAllSubcomponents('valarm')).toHaveLength(1)
    // RFC 5545 §3.8.7.4: SEQUENCE starts at 0.
    expect(Number(vevent.getFirstPropertyValue('sequence') ?? 0)).toBe(0)
  })

  it('speaks in the site\'s voice: name, address, phone, local time with the zone, how long, what to bring, how to cancel', () => {
    const text = invitation.parsed.text ?? ''
    expect(invitation.parsed.subject).toMatch(/^Your dental visit at Test annex/)
    expect(text).toContain(annex.address)
    expect(text).toContain(annex.phone)
    // The zone's name follows daylight saving time on the visit's date (IANA tz database, US rule).
    const local = DateTime.fromISO(atAhead(2, MONDAY, '10:00', ZONE)).setZone(ZONE)
    const zoneName = local.isInDST ? 'Pacific Daylight Time' : 'Pacific Standard Time'
    expect(text).toContain(`${local.toFormat('cccc, d LLLL yyyy')} at 10:00 AM (${zoneName})`)
    expect(local.toFormat('cccc')).toBe('Monday')
    expect(text).toMatch(/Plan for: about \d/)
    expect(text).toMatch(/Please bring a photo ID/)
    expect(text).toMatch(/To cancel or change the time, use the link above or call us at 555-0142/)
    expect(invitation.parsed.html).toContain('Confirm or ask to cancel')
    expect(visitLinkOf(invitation)).toContain('/visit/')
  })

  it('says no procedure, tooth or surface by default, in the e-mail or the .ics (HHS minimum necessary, 45 CFR 164.502(b))', () => {
    const all = everything(invitation)
    expect(all).not.toMatch(/composite/i)
    expect(all).not.toMatch(/tooth|teeth|surface/i)
    expect(all).not.toMatch(/\b19 ?MO\b|\bMO\b/)
    expect(all).toContain('Dental visit')
  })

  it('sends an update with the same UID and a higher SEQUENCE when the visit moves (RFC 5546 §2.1.4, §2.1.5)', async () => {
    const visit = await manager.get(`/api/visits/${visitId}`)
    const moved = await manager.patch(`/api/visits/${visitId}`, { rowVersion: visit.body.rowVersion, startUtc: atAhead(2, TUESDAY, '14:00', ZONE) })
    expect(moved.status).toBe(200)
    const update = await arrived(visitId, 'update', annex.emails[0]!)
    expect(calendarMethodParam(update)).toBe('REQUEST')
    const vevent = veventOf(calendarOf(update))
    expect(vevent.getFirstPropertyValue('uid')).toBe(uid)
    expect(Number(vevent.getFirstPropertyValue('sequence'))).toBeGreaterThan(0)
    expect((vevent.getFirstPropertyValue('dtstart') as { toJSDate: () => Date }).toJSDate().toISOString()).toBe(new Date(atAhead(2, TUESDAY, '14:00', ZONE)).toISOString())
    expect(update.parsed.subject).toMatch(/^Changed:/)
    const local = DateTime.fromISO(atAhead(2, TUESDAY, '14:00', ZONE)).setZone(ZONE)
    expect(local.toFormat('cccc h:mm a')).toBe('Tuesday 2:00 PM')
    const zoneName = local.isInDST ? 'Pacific Daylight Time' : 'Pacific Standard Time'
    expect(update.parsed.text).toContain(`${local.toFormat('cccc, d LLLL yyyy')} at 2:00 PM (${zoneName})`)
  })

  it('re-plans the reminders of a moved visit, outside quiet hours', async () => {
    const reminders = (await outboxRowsOf(visitId)).filter((row) => row.kind === 'reminder')
    const live = reminders.filter((row) => row.state === 'queued')
    expect(reminders.filter((row) => row.state === 'skipped').length).toBe(2)
    expect(live.map((row) => DateTime.fromJSDate(row.due_at, { zone: ZONE }).toFormat("yyyy-MM-dd'T'HH:mm"))).toEqual([48, 3].map((hours) => DateTime.fromISO(atAhead(2, TUESDAY, '14:00', ZONE)).minus({ hours }).setZone(ZONE).toFormat("yyyy-MM-dd'T'HH:mm")))
  })

  it('sends METHOD:CANCEL with the same UID, STATUS:CANCELLED, a higher SEQUENCE and no VALARM on cancel (RFC 5546 §3.2.5)', async () => {
    const before = await testDb()('visits').where({ id: visitId }).first()
    const cancelled = await manager.post(`/api/visits/${visitId}/cancel`, { reason: 'Patient is travelling' })
    expect(cancelled.status).toBe(200)
    const cancellation = await arrived(visitId, 'cancellation', annex.emails[0]!)
    expect(calendarMethodParam(cancellation)).toBe('CANCEL')
    const calendar = calendarOf(cancellation)
    expect(calendar.getFirstPropertyValue('method')).toBe('CANCEL')
    const vevent = veventOf(calendar)
    expect(vevent.getFirstPropertyValue('uid')).toBe(uid)
    expect(vevent.getFirstPropertyValue('status')).toBe('CANCELLED')
    expect(Number(vevent.getFirstPropertyValue('sequence'))).toBe(before.ical_sequence + 1)
    expect(vevent.getAllSubcomponents('valarm')).toHaveLength(0)
    expect(vevent.getAllProperties('dtstamp')).toHaveLength(1)
    expect(cancellation.parsed.subject).toMatch(/^Cancelled:/)
    // No reminder for a cancelled visit.
    expect((await outboxRowsOf(visitId)).filter((row) => row.kind === 'reminder' && row.state === 'queued')).toHaveLength(0)
  })
})

describe('consent', () => {
  it('queues nothing for a patient without e-mail consent', async () => {
    await testDb()('patients').where({ id: annex.patientIds[1] }).update({ email_consent: false })
    const booked = await manager.post('/api/visits', bookingFor(annex, 1, atAhead(3, MONDAY, '10:00', ZONE)))
    expect(booked.status).toBe(201)
    expect(await outboxRowsOf(booked.body.id)).toHaveLength(0)
  })

  it('checks consent again at send time: withdrawn after booking, the message is skipped', async () => {
    // Booked on a mail lane no process serves, so nothing is sent before consent is withdrawn.
    const held = await createMailAnnex({ patients: 1, mailLane: `held-${annex.siteId}` })
    const booked = await manager.post('/api/visits', bookingFor(held, 0, atAhead(3, MONDAY, '13:00', ZONE)))
    expect(booked.status).toBe(201)
    expect((await outboxRow(booked.body.id, 'invitation')).state).toBe('queued')
    await testDb()('patients').where({ id: held.patientIds[0] }).update({ email_consent: false })
    // Back on the default lane: the main test server's dispatcher takes it, checks and skips it.
    await testDb()('sites').where({ id: held.siteId }).update({ settings: JSON.stringify({ minimumNoticeMinutes: 0 }) })
    await expect.poll(async () => (await outboxRow(booked.body.id, 'invitation')).state, { timeout: 15_000 }).toBe('skipped')
    expect((await outboxRow(booked.body.id, 'invitation')).last_error).toMatch(/not agreed to e-mail/)
  })
})

describe('mail held up past the visit', () => {
  it('skips an invitation once the visit has begun, and a cancellation once its time has passed', async () => {
    const held = await createMailAnnex({ patients: 2, mailLane: `late-${annex.siteId}` })
    const kept = await manager.post('/api/visits', bookingFor(held, 0, atAhead(3, TUESDAY, '09:00', ZONE)))
    const dropped = await manager.post('/api/visits', bookingFor(held, 1, atAhead(3, TUESDAY, '11:00', ZONE)))
    expect([kept.status, dropped.status]).toEqual([201, 201])
    expect((await manager.post(`/api/visits/${dropped.body.id}/cancel`, { reason: 'Patient moved away' })).status).toBe(200)
    // As if the mail had waited through a long outage: both visits now lie in the past.
    const lastWeek = DateTime.now().minus({ days: 7 })
    for (const id of [kept.body.id, dropped.body.id]) {
      await testDb()('visits').where({ id }).update({ start_utc: lastWeek.toJSDate(), end_utc: lastWeek.plus({ hours: 1 }).toJSDate() })
    }
    await testDb()('sites').where({ id: held.siteId }).update({ settings: JSON.stringify({ minimumNoticeMinutes: 0 }) })
    await expect.poll(async () => (await outboxRow(kept.body.id, 'invitation')).state, { timeout: 15_000 }).toBe('skipped')
    expect((await outboxRow(kept.body.id, 'invitation')).last_error).toBe('the visit has started')
    await expect.poll(async () => (await outboxRow(dropped.body.id, 'cancellation')).state, { timeout: 15_000 }).toBe('skipped')
    expect((await outboxRow(dropped.body.id, 'cancellation')).last_error).toBe('the visit time has passed')
  })
})

describe('the signed visit link', () => {
  let visitId: number
  let link: string
  let token: string

  beforeAll(async () => {
    const booked = await manager.post('/api/visits', bookingFor(annex, 3, atAhead(4, MONDAY, '09:00', ZONE)))
    expect(booked.status).toBe(201)
    visitId = booked.body.id
    link = visitLinkOf(await arrived(visitId, 'invitation', annex.emails[3]!))
    token = decodeURIComponent(new URL(link).pathname.split('/').pop()!)
  })

  it('opens the visit without signing in and confirms it', async () => {
    const patient = new ApiClient()
    const view = await patient.get(`/api/visit/${encodeURIComponent(token)}`)
    expect(view.status).toBe(200)
    expect(view.body).toMatchObject({ state: 'booked', canConfirm: true, canCancel: true, cancelPolicy: 'request', siteAddress: annex.address })
    expect(JSON.stringify(view.body)).not.toMatch(/composite|tooth|surface/i)
    const confirmed = await patient.post(`/api/visit/${encodeURIComponent(token)}/confirm`)
    expect(confirmed.status).toBe(200)
    expect(confirmed.body.state).toBe('confirmed')
    expect((await testDb()('visits').where({ id: visitId }).first()).state).toBe('confirmed')
    // Confirming twice is harmless.
    expect((await patient.post(`/api/visit/${encodeURIComponent(token)}/confirm`)).status).toBe(200)
  })

  it('refuses a tampered token with 404, and one for another visit', async () => {
    const patient = new ApiClient()
    const [id, expires, signature] = token.split('.')
    const flipped = `${signature!.slice(0, -2)}${signature!.endsWith('AA') ? 'BB' : 'AA'}`
    for (const bad of [`${id}.${expires}.${flipped}`, `${Number(id) + 1}.${expires}.${signature}`, `${id}.${Number(expires) + 86_400}.${signature}`, 'not-a-token']) {
      expect((await patient.get(`/api/visit/${encodeURIComponent(bad)}`)).status).toBe(404)
      expect((await patient.post(`/api/visit/${encodeURIComponent(bad)}/confirm`)).status).toBe(404)
    }
    expect((await patient.get(`/api/visits/${visitId + 1}/ics?token=${encodeURIComponent(token)}`)).status).toBe(404)
  })

  it('refuses an expired token (signed correctly, but after the visit) with 410', async () => {
    const row = await testDb()('visits').where({ id: visitId }).first()
    const expired = signVisitToken(process.env.NUXT_MAIL_LINK_SECRET!, { id: visitId, icalUid: row.ical_uid, expiresAtMs: Date.now() - 60_000 })
    expect((await new ApiClient().get(`/api/visit/${encodeURIComponent(expired)}`)).status).toBe(410)
    expect((await new ApiClient().post(`/api/visit/${encodeURIComponent(expired)}/confirm`)).status).toBe(410)
  })

  it('downloads the current event as text/calendar with the visit\'s UID (RFC 5545 §3.6.1, RFC 6047 §2.4)', async () => {
    const response = await fetch(new URL(`/api/visits/${visitId}/ics?token=${encodeURIComponent(token)}`, manager.baseURL))
    expect(response.status).toBe(200)
    expect(response.headers.get('content-type')).toMatch(/^text\/calendar;.*method=REQUEST/)
    const vevent = veventOf(parseCalendar(await response.text()))
    const row = await testDb()('visits').where({ id: visitId }).first()
    expect(vevent.getFirstPropertyValue('uid')).toBe(row.ical_uid)
    expect((await new ApiClient().get(`/api/visits/${visitId}/ics`)).status).toBe(400)
    // Links in e-mails sent before the routes were renamed still open the same event.
    const old = await fetch(new URL(`/api/appointments/${visitId}/ics?token=${encodeURIComponent(token)}`, manager.baseURL))
    expect(old.status).toBe(200)
    expect(veventOf(parseCalendar(await old.text())).getFirstPropertyValue('uid')).toBe(row.ical_uid)
  })

  it('records a cancel request for the front desk without cancelling (default policy)', async () => {
    const asked = await new ApiClient().post(`/api/visit/${encodeURIComponent(token)}/cancel`)
    expect(asked.status).toBe(200)
    expect(asked.body).toMatchObject({ state: 'confirmed', cancelRequested: true, canCancel: false })
    const row = await testDb()('visits').where({ id: visitId }).first()
    expect(row.state).toBe('confirmed')
    expect(row.cancel_requested_at).not.toBeNull()
    expect(await testDb()('audit_log').where({ action: 'visit_cancel_requested', entity_id: String(visitId) })).toHaveLength(1)
    // The front desk sees it: on the visit and in the Outbox's list of requests.
    expect((await manager.get(`/api/visits/${visitId}`)).body.cancelRequestedAt).toBe(row.cancel_requested_at.toISOString())
    const requests = await manager.get(`/api/outbox/cancel-requests?siteId=${annex.siteId}`)
    expect(requests.body.map((request: { visitId: number }) => request.visitId)).toContain(visitId)
    expect((await (await signedInAs('desk.aspen@fernhollow.test')).get(`/api/outbox/cancel-requests?siteId=${annex.siteId}`)).status).toBe(403)
  })

  it('cancels at once where the site says so, sending the cancellation', async () => {
    const eager = await createMailAnnex({ patients: 1, settings: { patientCancel: 'cancel' } })
    const booked = await manager.post('/api/visits', bookingFor(eager, 0, atAhead(4, TUESDAY, '09:00', ZONE)))
    const own = visitLinkOf(await arrived(booked.body.id, 'invitation', eager.emails[0]!))
    const ownToken = decodeURIComponent(new URL(own).pathname.split('/').pop()!)
    const cancelled = await new ApiClient().post(`/api/visit/${encodeURIComponent(ownToken)}/cancel`)
    expect(cancelled.body.state).toBe('cancelled')
    const mail = await arrived(booked.body.id, 'cancellation', eager.emails[0]!)
    expect(calendarMethodParam(mail)).toBe('CANCEL')
    expect(await testDb()('visit_segments').where({ visit_id: booked.body.id })).toHaveLength(0)
  })
})

describe('Outbox API', () => {
  it('lists a visit\'s messages, shows the rendered message and .ics, and resends', async () => {
    const booked = await manager.post('/api/visits', bookingFor(annex, 4, atAhead(5, MONDAY, '10:00', ZONE)))
    const first = await arrived(booked.body.id, 'invitation', annex.emails[4]!)
    const list = await manager.get(`/api/outbox?visitId=${booked.body.id}`)
    expect(list.status).toBe(200)
    const invitation = list.body.find((message: { kind: string }) => message.kind === 'invitation')
    expect(invitation).toMatchObject({ state: 'sent', recipient: annex.emails[4] })
    expect(invitation.messageId).toBe(first.parsed.messageId)
    // One Message-ID per outbox row (RFC 5322 §3.6.4), so a copy sent twice after a crash is one message.
    // It carries the row's send key too, so IDs stay unique when a database is rebuilt and ids repeat.
    expect(first.parsed.messageId).toMatch(new RegExp(`^<outbox-${invitation.id}\\.[0-9a-f]{32}@[A-Za-z0-9.-]+>$`))
    const detail = await manager.get(`/api/outbox/${invitation.id}`)
    expect(detail.body).toMatchObject({ preview: false, rendered: { method: 'REQUEST', to: annex.emails[4], subject: first.parsed.subject } })
    expect(detail.body.rendered.ics).toContain(`UID:${booked.body.icalUid}`)
    const reminder = list.body.find((message: { kind: string; state: string }) => message.kind === 'reminder' && message.state === 'queued')
    expect((await manager.get(`/api/outbox/${reminder.id}`)).body).toMatchObject({ preview: true, rendered: { subject: expect.stringMatching(/^Reminder:/) } })

    const again = await manager.post(`/api/outbox/${invitation.id}/resend`)
    expect(again.status).toBe(201)
    const copy = await waitForOutboxMail(annex.emails[4]!, again.body.id)
    expect(veventOf(calendarOf(copy)).getFirstPropertyValue('uid')).toBe(booked.body.icalUid)
    expect(copy.parsed.messageId).not.toBe(first.parsed.messageId)
    expect((await manager.post(`/api/outbox/${reminder.id}/resend`)).status).toBe(409)
  })

  it('names the procedure only when the site turns includeProcedureNames on', async () => {
    const open = await createMailAnnex({ patients: 1, settings: { includeProcedureNames: true } })
    const booked = await manager.post('/api/visits', bookingFor(open, 0, atAhead(5, TUESDAY, '10:00', ZONE)))
    const mail = await arrived(booked.body.id, 'invitation', open.emails[0]!)
    expect(everything(mail)).toContain('Posterior composite')
  })

  it('keeps front desk to its own sites, answers 400, 401 and 404', async () => {
    const [someRow] = await testDb()('outbox').where({ site_id: annex.siteId }).limit(1)
    const desk = await signedInAs('desk.aspen@fernhollow.test')
    expect((await desk.get(`/api/outbox?siteId=${annex.siteId}`)).status).toBe(403)
    expect((await desk.get(`/api/outbox/${someRow.id}`)).status).toBe(403)
    expect((await desk.get('/api/outbox')).body.every((message: { siteId: number }) => message.siteId !== annex.siteId)).toBe(true)
    expect((await (await signedInAs('dentist@fernhollow.test')).get('/api/outbox')).status).toBe(403)
    const bad = await manager.get('/api/outbox?state=lost')
    expect(bad.status).toBe(400)
    expect(bad.body.data.field).toBe('state')
    expect((await manager.get('/api/outbox/999999999')).status).toBe(404)
    expect((await new ApiClient().get('/api/outbox')).status).toBe(401)
  })
})
