// An app process is killed (kill -9) in the middle of a burst of bookings that each queue an
// invitation e-mail: HAProxy sends everything to the other process, which also sends the rows the
// dead one had claimed once their lease runs out. Duplicate e-mails at the catcher are counted.
// The kill comes while the mail catcher is paused, so both dispatchers hold claimed rows mid-send.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { utcAt } from '../helpers/booking-fixtures'
import { createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { mailsContaining, outboxIdOf } from '../helpers/mail'
import { MONDAY, weekdayAhead } from '../helpers/dates'
import { bookWithRetry, burst, clientThroughProxy, clusterPart, signalMailCatcher, statuses, waitFor } from './cluster'

const BOOKINGS = 60
const BATCH = Number(process.env.NUXT_OUTBOX_BATCH_SIZE ?? 20) // scripts/cluster/test.sh sets 5
let annex: MailAnnex
let clients: ApiClient[]

beforeAll(async () => {
  // No reminders: only the invitation, due at once, per booking.
  annex = await createMailAnnex({ patients: BOOKINGS, settings: { reminderOffsetsHours: [] } })
  clients = await Promise.all(Array.from({ length: 4 }, () => clientThroughProxy('admin@fernhollow.test')))
})
afterAll(async () => {
  signalMailCatcher('SIGCONT')
  await clusterPart('app-start', 1)
  await closeTestDb()
})

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
    const rows = await invitations().select('id', 'attempts')
    expect(rows).toHaveLength(BOOKINGS)

    const arrivals = new Map<number, number>()
    await waitFor(async () => {
      arrivals.clear()
      for (const email of annex.emails) {
        for (const mail of await mailsContaining(email)) {
          const id = outboxIdOf(mail)
          if (id !== null) arrivals.set(id, (arrivals.get(id) ?? 0) + 1)
        }
      }
      return rows.every((row) => arrivals.has(Number(row.id)))
    }, 'every invitation at the mail catcher', 60_000)
    const duplicates = [...arrivals.values()].reduce((sum, count) => sum + count - 1, 0)
    const takenOver = rows.filter((row) => Number(row.attempts) > 1).length
    console.log(`[cluster] app process 1 killed after 20 of ${BOOKINGS} bookings; ${answers.filter((answer) => answer.attempts > 1).length} bookings were tried again; answers ${JSON.stringify(statuses(answers))}`)
    console.log(`[cluster] ${claimedAtKill} invitations were claimed (state sending) when app process 1 was killed`)
    console.log(`[cluster] all ${BOOKINGS} invitations sent ${waitedMs} ms after the burst; ${takenOver} were claimed again after the lease (the dead process's claims)`)
    console.log(`[cluster] e-mail duplicates at the catcher: ${duplicates} of ${[...arrivals.values()].reduce((sum, count) => sum + count, 0)} messages (one Message-ID per outbox row, so a receiver that drops repeated Message-IDs shows each once)`)
    expect(rows.every((row) => (arrivals.get(Number(row.id)) ?? 0) >= 1)).toBe(true)
    expect(takenOver).toBeGreaterThan(0) // the dead process's claims, sent by the survivor after the lease
  })
})
