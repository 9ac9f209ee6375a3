// An app process is killed (kill -9) in the middle of a burst of bookings that each queue an
// invitation e-mail: HAProxy sends everything to the other process, which also sends the rows the
// dead one had claimed once their lease runs out. Duplicate e-mails at the catcher are counted.
// The kill comes while the mail catcher is paused, so both dispatchers hold claimed rows mid-send.
// Then the one window left: a dispatcher killed after the SMTP server took a message and before the
// 'sent' record. The copy the survivor sends after the lease carries the same Message-ID (the row's
// Message-ID kept on the row), and the catcher, keeping one message per ID, delivers it once.
import { existsSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import type { Knex } from 'knex'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { utcAt } from '../helpers/booking-fixtures'
import { createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { deliveriesPerRow, MAIL_DIR, mailsContaining } from '../helpers/mail'
import { MONDAY, TUESDAY, weekdayAhead } from '../helpers/dates'
import { bookWithRetry, burst, clientThroughProxy, clusterPart, signalMailCatcher, statuses, waitFor } from './cluster'

const BOOKINGS = 60
const BATCH = Number(process.env.NUXT_OUTBOX_BATCH_SIZE ?? 20) // scripts/cluster/test.sh sets 5
let annex: MailAnnex
let clients: ApiClient[]
let killedApp = 1

beforeAll(async () => {
  // No reminders: only the invitation, due at once, per booking.
  annex = await createMailAnnex({ patients: BOOKINGS, settings: { reminderOffsetsHours: [] } })
  clients = await Promise.all(Array.from({ length: 4 }, () => clientThroughProxy('admin@fernhollow.test')))
})
afterAll(async () => {
  signalMailCatcher('SIGCONT')
  await clusterPart('app-start', killedApp)
  await closeTestDb()
})

/** Messages the catcher was sent again with a Message-ID it already kept (scripts/mail-catcher.ts), for these outbox rows. */
function submittedAgain(messageIds: string[]): number {
  const file = join(MAIL_DIR, '.duplicates')
  const lines = existsSync(file) ? readFileSync(file, 'utf8').split('\n') : []
  return lines.filter((line) => messageIds.includes(line)).length
}

function bookingBody(index: number) {
  // One provider: two-hour slots, ten a day, Monday onwards in the annex's week 5.
  const hour = String(1 + 2 * (index % 10)).padStart(2, '0')
  return {
    siteId: annex.siteId, operatoryId: annex.operatoryIds[index % 2], providerId: annex.providerIds[0], patientId: annex.patientIds[index],
    startUtc: utcAt(`${weekdayAhead(5, MONDAY + Math.floor(index / 10), annex.timeZone)}T${hour}:00`, annex.timeZone),
    items: [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }],
  }
}

describe('an app process killed mid-burst', () => {
  it('the other keeps serving and sends the dead one\'s claimed e-mails after the lease', async () => {
    let killing: Promise<void> | undefined
    let claimedAtKill = 0
    const claimed = async () => (await testDb()('outbox').where({ site_id: annex.siteId, state: 'sending' }).count({ n: '*' }).first())!.n
    const killWhileSending = async () => {
      signalMailCatcher('SIGSTOP')
      try {
        // A dispatcher holds at most one batch while its first send hangs: more than one batch
        // claimed means both processes hold claimed rows when one of them is killed.
        await waitFor(async () => Number(await claimed()) > BATCH, 'both dispatchers holding claims', 60_000)
        claimedAtKill = Number(await claimed())
        await clusterPart('app-kill', 1)
      } finally {
        signalMailCatcher('SIGCONT')
      }
    }
    const answers = await burst(BOOKINGS, 8, (index) => bookWithRetry(clients[index % clients.length]!, bookingBody(index), `app-kill-${annex.siteId}-${index}`), (_, done) => {
      if (done === 20 && !killing) killing = killWhileSending()
    })
    await killing
    expect(statuses(answers)).toEqual({ 201: BOOKINGS })
    const visitIds = answers.map((answer) => Number(answer.body.id))
    expect(new Set(visitIds).size).toBe(BOOKINGS)

    const invitations = () => testDb()('outbox').whereIn('visit_id', visitIds).where({ kind: 'invitation' })
    const waitedMs = await waitFor(async () => (await invitations().whereNot('state', 'sent')).length === 0, 'every invitation sent')
    const rows = await invitations().select('id', 'attempts', 'message_id')
    expect(rows).toHaveLength(BOOKINGS)

    // Patients' messages carry no internal headers: each row's Message-ID (kept on the row) finds it.
    let arrivals = new Map<number, number>()
    await waitFor(async () => {
      arrivals = await deliveriesPerRow((await Promise.all(annex.emails.map((email) => mailsContaining(email)))).flat())
      return rows.every((row) => arrivals.has(Number(row.id)))
    }, 'every invitation at the mail catcher', 60_000)
    const duplicates = [...arrivals.values()].reduce((sum, count) => sum + count - 1, 0)
    const repeated = submittedAgain(rows.map((row) => String(row.message_id)))
    const takenOver = rows.filter((row) => Number(row.attempts) > 1).length
    console.log(`[cluster] app process 1 killed after 20 of ${BOOKINGS} bookings; ${answers.filter((answer) => answer.attempts > 1).length} bookings were tried again; answers ${JSON.stringify(statuses(answers))}`)
    console.log(`[cluster] ${claimedAtKill} invitations were claimed (state sending) when app process 1 was killed`)
    console.log(`[cluster] all ${BOOKINGS} invitations sent ${waitedMs} ms after the burst; ${takenOver} were claimed again after the lease (the dead process's claims)`)
    console.log(`[cluster] submitted again with the same Message-ID (sent, then the sender killed before recording it): ${repeated}`)
    console.log(`[cluster] e-mail duplicates at the catcher: ${duplicates} of ${[...arrivals.values()].reduce((sum, count) => sum + count, 0)} messages (one Message-ID per outbox row, so a receiver that drops repeated Message-IDs shows each once)`)
    expect(rows.every((row) => (arrivals.get(Number(row.id)) ?? 0) >= 1)).toBe(true)
    expect(takenOver).toBeGreaterThan(0) // the dead process's claims, sent by the survivor after the lease
    await clusterPart('app-start', 1)
  })

  it('killed after the SMTP server took a message but before recording it: the copy is submitted again, delivered once', async () => {
    const second = await createMailAnnex({ patients: 12, settings: { reminderOffsetsHours: [] } })
    const client = await clientThroughProxy('admin@fernhollow.test')
    const sending = () => testDb()('outbox').where({ site_id: second.siteId, state: 'sending' })
    signalMailCatcher('SIGSTOP')
    let hold: Knex.Transaction | undefined
    try {
      const answers = await Promise.all(Array.from({ length: 12 }, (_, index) => bookWithRetry(client, {
        ...bookingBody(index), siteId: second.siteId, operatoryId: second.operatoryIds[index % 2], providerId: second.providerIds[0], patientId: second.patientIds[index],
        startUtc: utcAt(`${weekdayAhead(5, TUESDAY + Math.floor(index / 10), second.timeZone)}T${String(1 + 2 * (index % 10)).padStart(2, '0')}:00`, second.timeZone),
      }, `dup-window-${second.siteId}-${index}`)))
      expect(statuses(answers)).toEqual({ 201: 12 })
      // Each dispatcher sends its claims one at a time and keeps a row's Message-ID just before trying
      // it: two claimed rows with a Message-ID are the two dispatchers' first messages, each waiting on
      // the stopped catcher. (Holding the rows any earlier would stop the Message-ID record instead.)
      await waitFor(async () => (await sending().whereNotNull('message_id')).length >= 2, 'a message in flight from each dispatcher', 60_000)
      // Hold the claimed rows, so a dispatcher's 'sent' record waits after its first message went out.
      hold = await testDb().transaction()
      await hold('outbox').where({ site_id: second.siteId, state: 'sending' }).forUpdate().select('id')
    } finally {
      signalMailCatcher('SIGCONT')
    }
    // Both dispatchers' first messages are now taken by the catcher, and each dispatcher waits to record
    // its own (the held rows' Message-IDs find them at the catcher): kill app 1.
    const inFlight = (await sending().whereNotNull('message_id').select('id')).map((row) => Number(row.id))
    await waitFor(async () => {
      const arrived = await deliveriesPerRow((await Promise.all(second.emails.map((email) => mailsContaining(email)))).flat())
      return inFlight.filter((id) => arrived.has(id)).length >= 2
    }, 'a message from each dispatcher at the catcher', 60_000)
    killedApp = 1
    await clusterPart('app-kill', killedApp)
    // The dead process's 'sent' record already reached MariaDB and waits for the held row; a process
    // that died before sending it would leave nothing behind. So keep holding until that statement gave
    // up (lock wait timeout), as if it never came. The survivor's records waiting beside it give up too.
    await waitFor(async () => {
      const [rows] = await testDb().raw("SELECT COUNT(*) AS n FROM information_schema.PROCESSLIST WHERE INFO LIKE 'update `outbox`%'")
      return Number(rows[0].n) === 0
    }, 'the waiting records to give up', 60_000)
    await hold!.rollback()

    const rowsOf = () => testDb()('outbox').where({ site_id: second.siteId, kind: 'invitation' })
    await waitFor(async () => (await rowsOf()).every((row) => row.state === 'sent'), 'every invitation sent')
    const rows = await rowsOf()
    const kept = await deliveriesPerRow((await Promise.all(second.emails.map((email) => mailsContaining(email)))).flat())
    const again = submittedAgain(rows.map((row) => String(row.message_id)))
    console.log(`[cluster] crash between SMTP acceptance and the record: app process ${killedApp} killed with a message accepted and not recorded; ${again} submitted again after the lease with the same Message-ID; ${[...kept.values()].reduce((sum, count) => sum + count - 1, 0)} kept twice at the catcher`)
    expect(again).toBeGreaterThan(0)
    expect(rows.map((row) => kept.get(Number(row.id)) ?? 0)).toEqual(rows.map(() => 1))
  })
})
