// The writer node is killed (kill -9) in the middle of a 200-booking burst through HAProxy: writes
// move to the next node, clients try again with the same Idempotency-Key, nothing is lost or booked
// twice, and the killed node rejoins (IST or SST) until the cluster has three nodes again.
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt, type Annex } from '../helpers/booking-fixtures'
import { FRIDAY, weekdayAhead } from '../helpers/dates'
import { overlapCounts } from '../helpers/overlaps'
import { bookWithRetry, burst, clientThroughProxy, clusterPart, clusterSizeSeenBy, statuses, waitFor, writerNode, type Answer } from './cluster'

const BOOKINGS = 200
const LANES = 20 // rooms and providers: booking i takes room and provider i % 20, two-hour slot i / 20
let annex: Annex
let clients: ApiClient[]

beforeAll(async () => {
  annex = await createAnnex({ rooms: LANES, providers: LANES, patients: BOOKINGS })
  clients = await Promise.all(Array.from({ length: 4 }, () => clientThroughProxy('admin@fernhollow.test')))
})
afterAll(closeTestDb)

function bookingBody(index: number) {
  const lane = index % LANES
  const hour = String(1 + 2 * Math.floor(index / LANES)).padStart(2, '0')
  return {
    siteId: annex.siteId, operatoryId: annex.operatoryIds[lane], providerId: annex.providerIds[lane], patientId: annex.patientIds[index],
    startUtc: utcAt(`${weekdayAhead(4, FRIDAY, annex.timeZone)}T${hour}:00`, annex.timeZone), items: FILLING,
  }
}

describe('the writer node killed mid-burst', () => {
  it('moves writes to the next node; every booking answered 201 exists exactly once; the node rejoins', async () => {
    const writerBefore = await writerNode()
    const victim = Number(writerBefore.replace('n', ''))
    let killedAt = 0
    let killing: Promise<void> | undefined
    const answers: Answer[] = await burst(BOOKINGS, 16, (index) => bookWithRetry(clients[index % clients.length]!, bookingBody(index), `failover-${annex.siteId}-${index}`), (_, done) => {
      if (done === 60 && !killing) {
        killing = clusterPart('kill', victim).then(() => { killedAt = Date.now() })
      }
    })
    await killing
    const writerAfter = await writerNode()

    // Write unavailability: from the kill to the first 201 whose try began after it.
    const afterKill = answers.filter((answer) => answer.status === 201 && answer.startedAt >= killedAt).map((answer) => answer.at)
    const unavailableMs = Math.min(...afterKill) - killedAt
    const times = answers.filter((answer) => answer.status === 201).map((answer) => answer.at).sort((a, b) => a - b)
    const longestGapMs = Math.max(...times.slice(1).map((time, index) => time - times[index]!))
    const retried = answers.filter((answer) => answer.attempts > 1)
    console.log(`[cluster] writer ${writerBefore} killed after 60 of ${BOOKINGS} bookings; writes moved to ${writerAfter}`)
    console.log(`[cluster] writes unavailable for ${unavailableMs} ms (kill to first 201 begun after it); longest gap between 201 answers ${longestGapMs} ms`)
    console.log(`[cluster] ${retried.length} bookings needed more than one try (${retried.reduce((sum, answer) => sum + answer.attempts - 1, 0)} retries); answers ${JSON.stringify(statuses(answers))}`)

    expect(writerAfter).not.toBe(writerBefore)
    expect(statuses(answers)).toEqual({ 201: BOOKINGS })
    const ids = answers.map((answer) => Number(answer.body.id))
    expect(new Set(ids).size).toBe(BOOKINGS)
    const stored = await testDb()('visits').where({ site_id: annex.siteId }).select('id')
    expect(stored.map((row) => Number(row.id)).sort((a, b) => a - b)).toEqual([...ids].sort((a, b) => a - b))
    expect(await overlapCounts(testDb())).toEqual({ chairs: 0, handsOn: 0, patients: 0 })

    // The killed node comes back as a joiner and catches up.
    const rejoinStarted = Date.now()
    await clusterPart('start', victim)
    await waitFor(async () => (await Promise.all([1, 2, 3].map(clusterSizeSeenBy))).every((size) => size === 3), 'three nodes in the cluster')
    const log = readFileSync(join(process.env.CLUSTER_DIR ?? '.data/cluster', `n${victim}`, 'mariadb.err'), 'utf8')
    const lastStart = log.slice(log.lastIndexOf(' as process '))
    const ist = /Receiving IST: (\d+) writesets/.exec(lastStart)
    const transfer = /rsync SST completed on joiner/.test(lastStart) ? 'rsync SST (full copy)' : ist ? `IST (${ist[1]} writesets)`
      : /state transfer needed: no/.test(lastStart) ? 'no transfer (nothing missed)' : 'an unknown transfer'
    console.log(`[cluster] node ${writerBefore} rejoined by ${transfer} in ${Date.now() - rejoinStarted} ms; writes now go to ${await writerNode()}`)
    const onRejoined = await testDb().raw('SELECT COUNT(*) AS n FROM visits WHERE site_id = ?', [annex.siteId])
    expect(Number(onRejoined[0][0].n)).toBe(BOOKINGS)
  })
})
