// The outbox dispatcher under trouble: an SMTP server that is down, and two dispatcher processes on
// one outbox. Each runs in app servers of this test's own, on a mail lane of its own, sending to an
// SMTP catcher of its own, so the main test server never touches these messages.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient } from '../helpers/api-client'
import { freePort, startAppServer, type RunningServer } from '../helpers/app-server'
import { closeTestDb, testDb } from '../helpers/db'
import { bookingFor, createMailAnnex } from '../helpers/mail-fixtures'
import { deliveriesPerRow, ownCatcher, type OwnCatcher } from '../helpers/mail'
import { atAhead, MONDAY } from '../helpers/dates'

const ZONE = 'America/Los_Angeles'
const servers: RunningServer[] = []
const catchers: OwnCatcher[] = []

function dispatcherEnv(lane: string, smtpPort: number): Record<string, string> {
  return {
    NUXT_OUTBOX_LANE: lane, NUXT_SMTP_PORT: String(smtpPort), NUXT_OUTBOX_POLL_MS: '150', NUXT_OUTBOX_BATCH_SIZE: '10',
    NUXT_OUTBOX_RETRY_BASE_SECONDS: '1', NUXT_OUTBOX_RETRY_MAX_SECONDS: '2', NUXT_OUTBOX_MAX_ATTEMPTS: '100',
  }
}

afterAll(async () => {
  await Promise.all(servers.map((server) => server.stop()))
  await Promise.all(catchers.map((catcher) => catcher.stop()))
  await closeTestDb()
})

describe('with the SMTP server down', () => {
  let catcher: OwnCatcher
  let server: RunningServer
  const lane = `down-${randomUUID().slice(0, 8)}`

  beforeAll(async () => {
    catcher = ownCatcher(await freePort())
    catchers.push(catcher)
    server = await startAppServer(dispatcherEnv(lane, catcher.port))
    servers.push(server)
  })

  it('still books, keeps the messages waiting, and delivers each exactly once when SMTP returns', async () => {
    const annex = await createMailAnnex({ patients: 3, mailLane: lane })
    const desk = new ApiClient(server.url)
    await desk.signIn('manager@fernhollow.test')
    const ids: number[] = []
    for (const [index, time] of ['09:00', '11:00', '13:00'].entries()) {
      const booked = await desk.post('/api/visits', bookingFor(annex, index, atAhead(2, MONDAY, time, ZONE)))
      expect(booked.status).toBe(201)
      ids.push(booked.body.id)
    }
    const invitations = () => testDb()('outbox').whereIn('visit_id', ids).where({ kind: 'invitation' })
    // Tried, refused by the closed port, waiting for the next attempt.
    await expect.poll(async () => (await invitations()).every((row) => row.attempts >= 1 && row.state === 'queued' && /ECONNREFUSED/.test(row.last_error ?? '')), { timeout: 20_000, interval: 200 }).toBe(true)
    expect(catcher.received).toHaveLength(0)

    await catcher.start()
    await expect.poll(async () => (await invitations()).every((row) => row.state === 'sent'), { timeout: 20_000, interval: 200 }).toBe(true)
    // Once the dispatcher process has exited no send can still be in flight; the catcher answers 250
    // only after it has kept a message, so every delivery there was is counted below.
    await server.stop()
    const rows = await invitations()
    const counts = await deliveriesPerRow(catcher.received)
    expect(rows.map((row) => counts.get(row.id))).toEqual([1, 1, 1])
    expect(rows.every((row) => row.message_id && row.sent_at)).toBe(true)
  })
})

describe('two dispatcher processes', () => {
  it('deliver 200 due messages between them, none twice', async () => {
    const lane = `pair-${randomUUID().slice(0, 8)}`
    const catcher = ownCatcher(await freePort())
    catchers.push(catcher)
    await catcher.start()
    const annex = await createMailAnnex({ patients: 1, mailLane: lane })
    const [one, two] = await Promise.all([startAppServer(dispatcherEnv(lane, catcher.port)), startAppServer(dispatcherEnv(lane, catcher.port))])
    servers.push(one!, two!)
    const desk = new ApiClient(one!.url)
    await desk.signIn('manager@fernhollow.test')
    const booked = await desk.post('/api/visits', bookingFor(annex, 0, atAhead(3, MONDAY, '09:00', ZONE)))
    expect(booked.status).toBe(201)

    const rows = Array.from({ length: 200 }, () => ({
      kind: 'update', visit_id: booked.body.id, site_id: annex.siteId, due_at: new Date(), payload: JSON.stringify({ visitId: booked.body.id }),
    }))
    const batchTag = new Date()
    await testDb()('outbox').insert(rows)
    const ours = () => testDb()('outbox').where({ visit_id: booked.body.id, kind: 'update' }).where('created_at', '>=', new Date(batchTag.getTime() - 1000))
    expect(await ours()).toHaveLength(200)
    await expect.poll(async () => (await ours()).filter((row) => row.state === 'sent').length, { timeout: 60_000, interval: 250 }).toBe(200)
    await Promise.all([one!.stop(), two!.stop()]) // no send in flight after both processes exited

    const ids = (await ours()).map((row) => row.id)
    const counts = await deliveriesPerRow(catcher.received)
    expect(ids.filter((id) => counts.get(id) === 1)).toHaveLength(200)
    expect([...counts.values()].every((count) => count === 1)).toBe(true)
    const messageIds = new Set((await ours()).map((row) => row.message_id))
    expect(messageIds.size).toBe(200)
    // Both processes took part (each claims batches of 10, skipping rows the other has locked); which
    // one sent a row is kept in the database, not in a header the patient receives.
    const senders = new Set((await ours()).map((row) => row.sent_by))
    expect(senders.size).toBe(2)
    expect(catcher.received.some((mail) => mail.parsed.headers.has('x-cuspline-dispatcher') || mail.parsed.headers.has('x-cuspline-outbox'))).toBe(false)
  })
})

describe('giving up and taking over', () => {
  it('marks a message failed after the last attempt, and sends one whose sender\'s lease ran out', async () => {
    const lane = `fail-${randomUUID().slice(0, 8)}`
    const catcher = ownCatcher(await freePort())
    catchers.push(catcher)
    const annex = await createMailAnnex({ patients: 1, mailLane: lane })
    const server = await startAppServer({ ...dispatcherEnv(lane, catcher.port), NUXT_OUTBOX_MAX_ATTEMPTS: '2' })
    servers.push(server)
    const desk = new ApiClient(server.url)
    await desk.signIn('manager@fernhollow.test')
    const booked = await desk.post('/api/visits', bookingFor(annex, 0, atAhead(4, MONDAY, '09:00', ZONE)))
    expect(booked.status).toBe(201)
    const invitation = () => testDb()('outbox').where({ visit_id: booked.body.id, kind: 'invitation' }).first()
    await expect.poll(async () => (await invitation()).state, { timeout: 20_000, interval: 200 }).toBe('failed')
    expect(await invitation()).toMatchObject({ attempts: 2, last_error: expect.stringMatching(/ECONNREFUSED/) })

    await catcher.start()
    // A row some other process claimed and then died on: 'sending' with its lease in the past.
    const [stranded] = await testDb()('outbox').insert({
      kind: 'update', visit_id: booked.body.id, site_id: annex.siteId, due_at: new Date(Date.now() - 300_000), state: 'sending',
      attempts: 1, lease_until: new Date(Date.now() - 1000), payload: JSON.stringify({ visitId: booked.body.id }),
    })
    await expect.poll(async () => (await testDb()('outbox').where({ id: stranded }).first()).state, { timeout: 20_000, interval: 200 }).toBe('sent')
    expect((await deliveriesPerRow(catcher.received)).get(stranded as number)).toBe(1)
    // The failed one stays failed until someone presses "resend".
    expect((await invitation()).state).toBe('failed')
  })
})
