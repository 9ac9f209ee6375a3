// Balance that suggests (issue 17 §3), against the real server and MariaDB: freed chair time refilled
// and how soon, the suggestions (waitlist and recall fits for quiet chairs, a rota move between a quiet
// and a tight site, a visit that could move to join short free stretches) with the actions the screen
// takes, and the figures as CSV. Rules and definitions are our own (common practice, no source);
// formula escaping follows OWASP "CSV Injection"; CSV lines end CRLF (RFC 4180 §2).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt, type Annex } from '../helpers/booking-fixtures'
import { daysFromToday, plusDays, weekdayAhead, THURSDAY } from '../helpers/dates'

const H = 3_600_000
let manager: ApiClient
let quiet: Annex
let tight: Annex
let day: string

beforeAll(async () => {
  manager = await signedInAs('manager@fernhollow.test')
  quiet = await createAnnex({ rooms: 1, providers: 1, patients: 7 })
  tight = await createAnnex({ rooms: 1, providers: 1, patients: 2 })
  day = weekdayAhead(9, THURSDAY, quiet.timeZone)
})
afterAll(closeTestDb)

const book = async (annex: Annex, patientIndex: number, localStart: string) => {
  const response = await manager.post('/api/visits', {
    siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[patientIndex],
    startUtc: utcAt(localStart, annex.timeZone), items: FILLING,
  })
  expect(response.status).toBe(201)
  return response.body as { id: number; startUtc: string; endUtc: string }
}

// The annexes are open around the clock, so a day with no visit holds 0 % and one filling about 4 %:
// with "quiet below 2 %" and "tight from 3 %" one booked visit makes a day tight.
const THRESHOLDS = 'quietBelow=0.02&tightFrom=0.03'

describe('freed time refilled on Balance', () => {
  it('counts the share of freed chair time later bookings took, and the median hours until they did', async () => {
    const date = plusDays(day, 3)
    const first = await book(quiet, 0, `${date}T09:00`)
    const second = await book(quiet, 1, `${date}T13:00`)
    for (const visit of [first, second]) expect((await manager.post(`/api/visits/${visit.id}/cancel`, { reason: 'Patient called' })).status).toBe(200)
    const refill = await book(quiet, 2, `${date}T09:00`) // takes the first visit's time again
    // As if the first was cancelled 5 hours ago and its time booked again 2 hours ago: 3 hours to refill.
    const db = testDb()
    const nowMs = Date.now()
    await db('audit_log').where({ entity: 'visit', entity_id: String(first.id), action: 'visit_cancelled' }).update({ created_at: new Date(nowMs - 5 * H) })
    await db('audit_log').where({ entity: 'visit', entity_id: String(second.id), action: 'visit_cancelled' }).update({ created_at: new Date(nowMs - 4 * H) })
    await db('visits').where({ id: refill.id }).update({ created_at: new Date(nowMs - 2 * H) })

    const response = await manager.get(`/api/balance?from=${date}&to=${date}&siteId=${quiet.siteId}`)
    expect(response.status).toBe(200)
    const minutes = (Date.parse(first.endUtc) - Date.parse(first.startUtc)) / 60_000
    expect(response.body.sites[0].refill).toEqual({
      freedVisits: 2, freedMinutes: 2 * minutes, refilledVisits: 1, refilledMinutes: minutes, refilledShare: 0.5, medianHoursToRefill: 3,
    })
  })
})

describe('Balance suggestions', () => {
  let entryId: number
  let recallId: number
  let examRecallId: number
  let middle: { id: number; startUtc: string }

  beforeAll(async () => {
    const db = testDb()
    // A waiting patient who takes a filling at the quiet annex on the quiet day, and can be e-mailed.
    await db('patients').where({ id: quiet.patientIds[3] }).update({ email: 'waiting.patient@example.test', email_consent: true })
    const entry = await manager.post('/api/waitlist', { patientId: quiet.patientIds[3], siteId: quiet.siteId, items: FILLING, from: day, to: day, noticeMinutes: 0 })
    expect(entry.status).toBe(201)
    entryId = entry.body.id
    // A patient of the quiet annex whose cleaning was due ten days ago.
    await db('patients').where({ id: quiet.patientIds[4] }).update({ preferred_site_id: quiet.siteId, email: 'recall.patient@example.test', email_consent: true })
    recallId = (await db('recalls').insert({ patient_id: quiet.patientIds[4], kind: 'cleaning', due_date: daysFromToday(-10, quiet.timeZone), updated_at: new Date() }))[0]!
    // Another whose exam was due twenty days ago (no e-mail).
    await db('patients').where({ id: quiet.patientIds[6] }).update({ preferred_site_id: quiet.siteId })
    examRecallId = (await db('recalls').insert({ patient_id: quiet.patientIds[6], kind: 'exam', due_date: daysFromToday(-20, quiet.timeZone), updated_at: new Date() }))[0]!
    // The tight annex's chair holds one visit that day; the quiet annex's dentist works there too.
    await book(tight, 0, `${day}T10:00`)
    const quietDentist = await db('providers').where({ id: quiet.providerIds[0] }).first('user_id')
    await db('user_sites').insert({ user_id: quietDentist.user_id, site_id: tight.siteId })
    // The next day at the quiet annex: a visit between two half-hour stretches of its chair.
    const next = plusDays(day, 1)
    const earlier = await book(quiet, 0, `${next}T09:00`)
    const length = Date.parse(earlier.endUtc) - Date.parse(earlier.startUtc)
    const at = (ms: number) => utcAt(new Date(ms).toISOString(), 'UTC')
    const second = await manager.post('/api/visits', { siteId: quiet.siteId, operatoryId: quiet.operatoryIds[0], providerId: quiet.providerIds[0], patientId: quiet.patientIds[1], startUtc: at(Date.parse(earlier.endUtc) + 30 * 60_000), items: FILLING })
    expect(second.status).toBe(201)
    middle = second.body
    const third = await manager.post('/api/visits', { siteId: quiet.siteId, operatoryId: quiet.operatoryIds[0], providerId: quiet.providerIds[0], patientId: quiet.patientIds[2], startUtc: at(Date.parse(middle.startUtc) + length + 30 * 60_000), items: FILLING })
    expect(third.status).toBe(201)
  })

  it('suggests the waiting patient, the overdue recall, the rota move and the visit to move, each with what its action needs', async () => {
    const response = await manager.get(`/api/balance/suggestions?from=${day}&to=${plusDays(day, 1)}&${THRESHOLDS}`)
    expect(response.status).toBe(200)
    const mine = response.body.suggestions.filter((item: { siteId: number }) => item.siteId === quiet.siteId)
    const waitlist = mine.find((item: { kind: string; entryId?: number }) => item.kind === 'waitlist_fit' && item.entryId === entryId)
    expect(waitlist).toMatchObject({ date: day, patientId: quiet.patientIds[3], providerId: quiet.providerIds[0], canOffer: true, offered: false, gap: { operatoryId: quiet.operatoryIds[0] } })
    expect(Date.parse(waitlist.startUtc)).toBeGreaterThanOrEqual(Date.parse(waitlist.gap.startUtc))
    // The waitlist matches a gap of at most 12 hours, so the quiet day's 24 open hours are offered 12 at a time.
    expect(Date.parse(waitlist.gap.endUtc) - Date.parse(waitlist.gap.startUtc)).toBe(12 * H)

    // The annex's dentist does no cleanings: only the exam recall has a real opening.
    const recalls = mine.filter((item: { kind: string }) => item.kind === 'recall_fit')
    expect(recalls.map((item: { recallId: number }) => item.recallId)).toEqual([examRecallId])
    expect(recalls[0]).toMatchObject({ patientId: quiet.patientIds[6], recallKind: 'exam', canMail: false, date: day, operatoryId: quiet.operatoryIds[0], providerId: quiet.providerIds[0] })

    const rota = mine.find((item: { kind: string }) => item.kind === 'rota_move')
    expect(rota).toMatchObject({ date: day, providerId: quiet.providerIds[0], fromSiteId: quiet.siteId, toSiteId: tight.siteId, fromShare: 0, localStart: '00:00', localEnd: '24:00' })
    expect(rota.toShare).toBeGreaterThanOrEqual(0.03)

    const consolidate = mine.find((item: { kind: string }) => item.kind === 'consolidate')
    expect(consolidate).toMatchObject({ visitId: middle.id, stretchesMinutes: [30, 30], joinedMinutes: 60, startUtc: new Date(middle.startUtc).toISOString() })
    expect(Date.parse(consolidate.newStartUtc)).toBe(Date.parse(middle.startUtc) - 30 * 60_000)
    // A suggestion moves nothing: the visit is where it was.
    expect((await testDb()('visits').where({ id: middle.id }).first('start_utc')).start_utc.toISOString()).toBe(new Date(middle.startUtc).toISOString())
  })

  it('keeps each kind to a few per site', async () => {
    const response = await manager.get(`/api/balance/suggestions?from=${day}&to=${plusDays(day, 1)}&siteId=${quiet.siteId}&${THRESHOLDS}`)
    expect(response.status).toBe(200)
    for (const kind of ['waitlist_fit', 'recall_fit', 'rota_move', 'consolidate']) {
      expect(response.body.suggestions.filter((item: { kind: string }) => item.kind === kind).length).toBeLessThanOrEqual(3)
    }
    // One site asked for: no other site to move a rota day to.
    expect(response.body.suggestions.some((item: { kind: string }) => item.kind === 'rota_move')).toBe(false)
  })

  it('the consolidate suggestion carries what "Send move offer" needs: the offer is sent, the visit does not move', async () => {
    const response = await manager.get(`/api/balance/suggestions?from=${plusDays(day, 1)}&to=${plusDays(day, 1)}&siteId=${quiet.siteId}&${THRESHOLDS}`)
    const consolidate = response.body.suggestions.find((item: { kind: string; visitId?: number }) => item.kind === 'consolidate' && item.visitId === middle.id)
    expect(consolidate).toBeDefined()
    await testDb()('patients').where({ id: quiet.patientIds[1] }).update({ email: 'moving.patient@example.test', email_consent: true })
    const sent = await manager.post(`/api/visits/${consolidate.visitId}/move-offers`, { startUtc: consolidate.newStartUtc, operatoryId: consolidate.operatoryId })
    expect(sent.status, JSON.stringify(sent.body)).toBe(201)
    expect(sent.body.startUtc).toBe(new Date(consolidate.newStartUtc).toISOString())
    expect((await testDb()('visits').where({ id: middle.id }).first('start_utc')).start_utc.toISOString()).toBe(new Date(middle.startUtc).toISOString())
  })

  it('acts through the existing offer and the impact preview; the rota day off is written only when saved, and then frees the provider for the extra day', async () => {
    const response = await manager.get(`/api/balance/suggestions?from=${day}&to=${day}&${THRESHOLDS}`)
    const waitlist = response.body.suggestions.find((item: { kind: string; entryId?: number }) => item.kind === 'waitlist_fit' && item.entryId === entryId)
    const offer = await manager.post('/api/waitlist/offers', { siteId: quiet.siteId, operatoryId: waitlist.gap.operatoryId, startUtc: waitlist.gap.startUtc, endUtc: waitlist.gap.endUtc, entryIds: [entryId] })
    expect(offer.status).toBe(200)
    expect(offer.body.sent).toHaveLength(1)

    const rota = response.body.suggestions.find((item: { kind: string; fromSiteId?: number }) => item.kind === 'rota_move' && item.fromSiteId === quiet.siteId)
    const body = { providerId: rota.providerId, kind: 'time_off', siteId: rota.fromSiteId, startDate: rota.date, endDate: rota.date, reason: `Balance: a day at ${rota.toSiteName}` }
    const preview = await manager.post('/api/shift-exceptions', { ...body, dryRun: true })
    expect(preview.status).toBe(200)
    expect(preview.body).toEqual({ strandedVisits: [] })
    expect(await testDb()('shift_exceptions').where({ provider_id: rota.providerId, start_date: rota.date }).count({ n: '*' }).first()).toEqual({ n: 0 })

    // Without the day off, an extra day at the tight annex clashes with the shift at the quiet one (409);
    // once the day off is saved, the same extra day is taken.
    const extra = { providerId: rota.providerId, kind: 'extra', siteId: rota.toSiteId, startDate: rota.date, endDate: rota.date, localStart: rota.localStart, localEnd: rota.localEnd, reason: 'Balance' }
    const refused = await manager.post('/api/shift-exceptions', extra)
    expect(refused.status).toBe(409)
    expect(refused.body.data).toMatchObject({ otherSiteId: quiet.siteId })
    expect((await manager.post('/api/shift-exceptions', body)).status).toBe(201)
    expect((await manager.post('/api/shift-exceptions', extra)).status).toBe(201)
  })

  it('suggests an overdue recall only where its plan has a real opening, and that opening books', async () => {
    // A day with nothing booked or off at the quiet annex; "quiet below 10 %" so one exam keeps it quiet.
    const date = plusDays(day, 2)
    const ask = () => manager.get(`/api/balance/suggestions?from=${date}&to=${date}&siteId=${quiet.siteId}&quietBelow=0.1&tightFrom=0.5`)
    const recallsIn = (body: { suggestions: Array<{ kind: string }> }) => body.suggestions.filter((item) => item.kind === 'recall_fit') as Array<Record<string, any>>
    const first = recallsIn((await ask()).body)
    // The cleaning recall (hygiene) has no provider who does cleanings: no suggestion for it.
    expect(first.map((item) => item.recallId)).toEqual([examRecallId])
    const fit = first[0]!
    expect(fit.items).toHaveLength(1)
    expect(fit.items[0].templateCode).toMatch(/^EXAM-/)
    expect(Date.parse(fit.endUtc) - Date.parse(fit.startUtc)).toBe(fit.chairMinutes * 60_000)
    expect(Date.parse(fit.startUtc)).toBeGreaterThanOrEqual(Date.parse(fit.gap.startUtc))
    expect(Date.parse(fit.startUtc)).toBeLessThan(Date.parse(fit.gap.endUtc))
    // The one click books exactly this opening: chair, provider, time and plan.
    const booked = await manager.post('/api/visits', { siteId: quiet.siteId, operatoryId: fit.operatoryId, providerId: fit.providerId, patientId: fit.patientId, startUtc: fit.startUtc, items: fit.items })
    expect(booked.status, JSON.stringify(booked.body)).toBe(201)
    expect(booked.body.endUtc).toBe(fit.endUtc)

    // Once the dentist does cleanings too, the cleaning recall fits, at a time the exam does not hold.
    const stored = (await testDb()('providers').where({ id: quiet.providerIds[0] }).first('capabilities')).capabilities
    const capabilities: string[] = typeof stored === 'string' ? JSON.parse(stored) : stored
    await testDb()('providers').where({ id: quiet.providerIds[0] }).update({ capabilities: JSON.stringify([...capabilities, 'hygiene']) })
    const second = recallsIn((await ask()).body)
    expect(second.map((item) => item.recallId)).toEqual([recallId])
    expect(second[0]!.items[0].templateCode).toMatch(/^CLEAN-/)
    expect(Date.parse(second[0]!.startUtc) >= Date.parse(fit.endUtc) || Date.parse(second[0]!.endUtc) <= Date.parse(fit.startUtc)).toBe(true)
    await testDb()('providers').where({ id: quiet.providerIds[0] }).update({ capabilities: JSON.stringify(capabilities) })
  })

  it('answers 400 naming the field, 401 signed out, 403 for the front desk', async () => {
    const late = await manager.get(`/api/balance/suggestions?from=${day}&to=${plusDays(day, 40)}`)
    expect(late.status).toBe(400)
    expect(late.body.data).toMatchObject({ field: 'to' })
    expect((await new ApiClient().get(`/api/balance/suggestions?from=${day}&to=${day}`)).status).toBe(401)
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    expect((await desk.get(`/api/balance/suggestions?from=${day}&to=${day}`)).status).toBe(403)
    expect((await desk.get(`/api/exports/balance?from=${day}&to=${day}`)).status).toBe(403)
  })
})

describe('Balance figures as CSV', () => {
  it('writes a row per site and day in the site\'s date order, a row for all days, and escapes formula-looking cells', async () => {
    const db = testDb()
    const site = await db('sites').where({ id: tight.siteId }).first('name')
    await db('sites').where({ id: tight.siteId }).update({ name: `=HYPERLINK ${site.name}`, date_order: 'day-month-year' })
    const response = await manager.get(`/api/exports/balance?from=${day}&to=${plusDays(day, 1)}&siteId=${tight.siteId}&${THRESHOLDS}`)
    expect(response.status).toBe(200)
    expect(response.headers.get('content-type')).toMatch(/^text\/csv/)
    expect(response.headers.get('content-disposition')).toContain(`balance-${day}-${plusDays(day, 1)}.csv`)
    const lines = (response.body as string).split('\r\n')
    expect(lines[0]).toBe('Site,Date,Chair open hours,Chair hours held,Chair use %,Band,Nobody on shift,Did not come %,Cancelled late %,Freed hours,Freed time refilled %,Median hours to refill')
    const [year, month, date] = day.split('-')
    expect(lines[1]).toMatch(new RegExp(`^'=HYPERLINK ${site.name},${date}/${month}/${year},24\\.0,\\d\\.\\d,\\d,tight,no,`))
    expect(lines[3]).toMatch(new RegExp(`^'=HYPERLINK ${site.name},All days,48\\.0,`))
    expect(lines.at(-1)).toBe('')
    await db('sites').where({ id: tight.siteId }).update({ name: site.name, date_order: 'month-day-year' })
  })
})
