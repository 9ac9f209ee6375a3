// Issue 16 §1: messages for a minor go to the guardian. A patient under 18 on the visit's date (age
// from the date of birth, the date taken in the site's zone) is written to at the guardian's e-mail and
// phone, greeted by the guardian's name with the patient named; with no guardian contact the message
// is skipped with the reason on the Outbox, never sent to the child. Real SMTP into the catcher (read
// with mailparser and ical.js), real texts through the SMS fake, on an app server of this file's own
// mail lane. Dates computed from today.
import { randomUUID } from 'node:crypto'
import { DateTime } from 'luxon'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient } from '../helpers/api-client'
import { startAppServer, type RunningServer } from '../helpers/app-server'
import { closeTestDb, testDb } from '../helpers/db'
import { bookingFor, createMailAnnex, outboxRowsOf, type MailAnnex } from '../helpers/mail-fixtures'
import { calendarPart, mailsContaining, parseCalendar, pollUntil, veventOf, waitForOutboxMail } from '../helpers/mail'
import { MONDAY, TUESDAY, WEDNESDAY, weekdayAhead } from '../helpers/dates'
import { fakeMessages, freshNumber } from '../helpers/sms'

const ZONE = 'America/Los_Angeles'
const lane = `guardian-${randomUUID().slice(0, 8)}`
const TEXT_TOO = { invitation: ['email', 'sms'], update: ['email'], cancellation: ['email'], reminder: ['email'] }

let server: RunningServer
let desk: ApiClient
let annex: MailAnnex
const tag = randomUUID().slice(0, 8)


/** The birth date that makes someone `years` old exactly on `date` (their birthday). */
function bornYearsBefore(date: string, years: number): string {
  return DateTime.fromISO(date).minus({ years }).toISODate()!
}

async function rowOf(visitId: number, kind: string, channel = 'email') {
  const rows = await pollUntil(() => outboxRowsOf(visitId), (found) => found.some((row) => row.kind === kind && row.channel === channel))
  return rows.find((row) => row.kind === kind && row.channel === channel)!
}

async function settled(outboxId: number) {
  return pollUntil(() => testDb()('outbox').where({ id: outboxId }).first(), (row) => row.state === 'sent' || row.state === 'skipped' || row.state === 'failed')
}

async function book(patientIndex: number, startLocal: string): Promise<number> {
  const [date, time] = startLocal.split('T') as [string, string]
  const startUtc = DateTime.fromISO(`${date}T${time}`, { zone: ZONE }).toUTC().toISO({ suppressMilliseconds: true })!
  const booked = await desk.post('/api/visits', bookingFor(annex, patientIndex, startUtc))
  expect(booked.status).toBe(201)
  return booked.body.id as number
}

beforeAll(async () => {
  server = await startAppServer({ NUXT_OUTBOX_LANE: lane, NUXT_OUTBOX_POLL_MS: '150', NUXT_OUTBOX_RETRY_BASE_SECONDS: '1', NUXT_OUTBOX_RETRY_MAX_SECONDS: '2' })
  annex = await createMailAnnex({ patients: 8, mailLane: lane, settings: { quietHours: null, messageChannels: TEXT_TOO } })
  desk = new ApiClient(server.url)
  await desk.signIn('manager@fernhollow.test')
}, 60_000)

afterAll(async () => {
  await server?.stop()
  await closeTestDb()
})

describe('e-mail for a minor', () => {
  it('goes to the guardian, greets the guardian and names the patient; the calendar invites the guardian', async () => {
    const date = weekdayAhead(3, MONDAY, ZONE)
    const guardianEmail = `guardian-${tag}-a@fernhollow.test`
    await testDb()('patients').where({ id: annex.patientIds[0] }).update({
      first_name: 'Mia', date_of_birth: bornYearsBefore(date, 9), guardian_name: 'Rosa Quill', guardian_email: guardianEmail, guardian_phone: null,
    })
    const visitId = await book(0, `${date}T10:00`)
    const row = await rowOf(visitId, 'invitation')
    const mail = await waitForOutboxMail(guardianEmail, row.id)
    const { last_name: lastName } = await testDb()('patients').where({ id: annex.patientIds[0] }).first('last_name')
    const patientName = `Mia ${lastName}`
    // Addressed to the guardian alone (RFC 5322 §3.6.3 To:), the child's own address nowhere.
    expect(mail.parsed.to && !Array.isArray(mail.parsed.to) ? mail.parsed.to.value.map((to) => to.address) : []).toEqual([guardianEmail])
    expect(mail.raw).not.toContain(annex.emails[0]!)
    const text = mail.parsed.text ?? ''
    expect(text).toMatch(/^Hello Rosa Quill,/)
    expect(text).toContain(`You are getting this message as the parent or guardian of ${patientName}, who is under 18.`)
    expect(text).toContain(`The dental visit for ${patientName} is set for the time below.`)
    expect(mail.parsed.subject).toMatch(new RegExp(`^The dental visit for ${patientName} at Test annex`))
    expect(mail.parsed.html).toContain('Hello Rosa Quill,')
    // RFC 5546 §3.2.2: the invitation's ATTENDEE is who is asked to answer, here the guardian.
    const attendee = veventOf(parseCalendar(calendarPart(mail).content.toString('utf8'))).getFirstProperty('attendee')!
    expect(String(attendee.getFirstValue()).toLowerCase()).toBe(`mailto:${guardianEmail}`)
    expect(attendee.getParameter('cn')).toBe('Rosa Quill')
    // The Outbox shows who it went to.
    const listed = await desk.get(`/api/outbox?siteId=${annex.siteId}&visitId=${visitId}`)
    expect(listed.status).toBe(200)
    const entry = (listed.body as Array<{ kind: string; channel: string; recipient: string | null }>).find((found) => found.kind === 'invitation' && found.channel === 'email')
    expect(entry?.recipient).toBe(`${guardianEmail} (guardian: Rosa Quill)`)
  })

  it('without a guardian e-mail is skipped with the reason on the Outbox, and nothing reaches the child', async () => {
    const date = weekdayAhead(3, TUESDAY, ZONE)
    await testDb()('patients').where({ id: annex.patientIds[1] }).update({ date_of_birth: bornYearsBefore(date, 12), guardian_name: 'Tomas Reed', guardian_email: null, guardian_phone: null })
    const visitId = await book(1, `${date}T10:00`)
    const row = await settled((await rowOf(visitId, 'invitation')).id)
    expect(row.state).toBe('skipped')
    const listed = await desk.get(`/api/outbox?siteId=${annex.siteId}&visitId=${visitId}`)
    const entry = (listed.body as Array<{ kind: string; channel: string; state: string; lastError: string | null; recipient: string | null }>).find((found) => found.kind === 'invitation' && found.channel === 'email')
    expect(entry).toMatchObject({ state: 'skipped', recipient: null })
    expect(entry?.lastError).toBe('the patient is under 18 and no guardian e-mail address is on file: not sent to the child')
    expect(await mailsContaining(annex.emails[1]!)).toEqual([])
  })

  it('judges age on the visit\'s date in the site\'s zone: 18 that day writes to the patient; 18 only in UTC still to the guardian', async () => {
    const date = weekdayAhead(3, WEDNESDAY, ZONE)
    const guardianEmail = `guardian-${tag}-c@fernhollow.test`
    // 18 on the visit's date (a minor today): the patient's own address.
    await testDb()('patients').where({ id: annex.patientIds[2] }).update({ date_of_birth: bornYearsBefore(date, 18), guardian_name: 'Ada Stone', guardian_email: guardianEmail })
    const adultVisit = await book(2, `${date}T09:00`)
    const adultMail = await waitForOutboxMail(annex.emails[2]!, (await rowOf(adultVisit, 'invitation')).id)
    expect((adultMail.parsed.text ?? '').split('\n')[0]).toBe('Hello Annex2,')
    expect(adultMail.raw).not.toContain(guardianEmail)
    // 22:00 in Los Angeles is already the next day in UTC; the birthday is that next day, so at the
    // site the patient is still 17: the guardian gets it.
    const nextDay = DateTime.fromISO(date).plus({ days: 1 }).toISODate()!
    const lateGuardian = `guardian-${tag}-d@fernhollow.test`
    await testDb()('patients').where({ id: annex.patientIds[3] }).update({ date_of_birth: bornYearsBefore(nextDay, 18), guardian_name: 'Lev Marsh', guardian_email: lateGuardian })
    const lateVisit = await book(3, `${date}T22:00`)
    const lateMail = await waitForOutboxMail(lateGuardian, (await rowOf(lateVisit, 'invitation')).id)
    expect((lateMail.parsed.text ?? '').split('\n')[0]).toBe('Hello Lev Marsh,')
    expect(lateMail.raw).not.toContain(annex.emails[3]!)
  })
})

describe('texts for a minor', () => {
  it('go to the guardian\'s number greeting the guardian and naming the patient; without one the text is skipped, not sent to the child', async () => {
    const date = weekdayAhead(4, MONDAY, ZONE)
    const guardianNumber = freshNumber()
    const childNumber = freshNumber()
    await testDb()('patients').where({ id: annex.patientIds[4] }).update({
      first_name: 'Noor', date_of_birth: bornYearsBefore(date, 14), phone: childNumber.written, sms_consent: true,
      guardian_name: 'Iris Vale', guardian_email: `guardian-${tag}-e@fernhollow.test`, guardian_phone: guardianNumber.written,
    })
    const visitId = await book(4, `${date}T10:00`)
    const sentRow = await settled((await rowOf(visitId, 'invitation', 'sms')).id)
    expect(sentRow.state).toBe('sent')
    const atGuardian = (await fakeMessages(guardianNumber.e164)).find((message) => message.sid === sentRow.message_id)
    expect(atGuardian?.body).toMatch(/^Test annex \S+: Hello Iris Vale, Noor's visit is booked for /)
    expect(await fakeMessages(childNumber.e164)).toEqual([])

    const lonelyChild = freshNumber()
    await testDb()('patients').where({ id: annex.patientIds[5] }).update({
      date_of_birth: bornYearsBefore(date, 15), phone: lonelyChild.written, sms_consent: true, guardian_name: null, guardian_email: null, guardian_phone: null,
    })
    const skippedVisit = await book(5, `${date}T12:00`)
    const skipped = await settled((await rowOf(skippedVisit, 'invitation', 'sms')).id)
    expect(skipped.state).toBe('skipped')
    expect(skipped.last_error).toBe('the patient is under 18 and no guardian mobile number is on file: not sent to the child')
    expect(await fakeMessages(lonelyChild.e164)).toEqual([])
  })
})

describe('recall e-mails for a minor', () => {
  it('go to the guardian, greeting the guardian and naming the patient; without a guardian address the front desk is told to call', async () => {
    const today = DateTime.now().setZone(ZONE).toISODate()!
    const guardianEmail = `guardian-${tag}-r@fernhollow.test`
    const [withGuardian, without] = [annex.patientIds[6]!, annex.patientIds[7]!]
    await testDb()('patients').where({ id: withGuardian }).update({
      first_name: 'Ola', date_of_birth: bornYearsBefore(today, 8), email_consent: true, preferred_site_id: annex.siteId, guardian_name: 'Pia Lund', guardian_email: guardianEmail,
    })
    await testDb()('patients').where({ id: without }).update({
      date_of_birth: bornYearsBefore(today, 9), email_consent: true, preferred_site_id: annex.siteId, guardian_name: null, guardian_email: null, guardian_phone: null,
    })
    const [first] = await testDb()('recalls').insert({ patient_id: withGuardian, kind: 'cleaning', due_date: today })
    const [second] = await testDb()('recalls').insert({ patient_id: without, kind: 'cleaning', due_date: today })

    const preview = await desk.post('/api/recalls/mail', { siteId: annex.siteId, recallIds: [first, second], preview: true })
    expect(preview.status, JSON.stringify(preview.body)).toBe(200)
    expect(preview.body.preview.to).toBe(guardianEmail)
    expect(preview.body.skipped).toEqual([{ recallId: second, reason: 'the patient is under 18 and no guardian e-mail address is on file: not sent to the child: call instead' }])

    const sent = await desk.post('/api/recalls/mail', { siteId: annex.siteId, recallIds: [first, second] })
    expect(sent.body.sent).toEqual([first])
    const row = await pollUntil(() => testDb()('outbox').where({ kind: 'recall', site_id: annex.siteId }).whereRaw("JSON_VALUE(payload, '$.recallId') = ?", [first!]).first(), (found) => Boolean(found))
    const mail = await waitForOutboxMail(guardianEmail, row.id)
    expect(mail.parsed.to).toMatchObject({ value: [{ address: guardianEmail, name: 'Pia Lund' }] })
    const { last_name: lastName, email: childEmail } = await testDb()('patients').where({ id: withGuardian }).first('last_name', 'email')
    expect(mail.parsed.text).toContain('Hello Pia Lund,')
    expect(mail.parsed.text).toContain(`parent or guardian of Ola ${lastName}`)
    expect((await mailsContaining(childEmail)).filter((arrived) => arrived.parsed.subject?.startsWith('Time for your'))).toEqual([])
  })
})
