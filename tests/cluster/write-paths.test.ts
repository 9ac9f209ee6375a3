// The app's other write paths through HAProxy's write listener on the Galera cluster: patients,
// rota changes (a written provider lock, triggers that bump the site's calendar version), the
// sign-in failure counters, and Idempotency-Keys; each write reaches all three nodes.
import { createConnection } from 'mysql2/promise'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient } from '../helpers/api-client'
import { closeTestDb, createTestUser, siteIdBySlug, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt } from '../helpers/booking-fixtures'
import { createTestProvider } from '../helpers/rota'
import { WEDNESDAY, weekdayAhead } from '../helpers/dates'
import { clientThroughProxy, HTTP_URL, statuses, waitFor } from './cluster'

let manager: ApiClient
beforeAll(async () => { manager = await clientThroughProxy('manager@fernhollow.test') })
afterAll(closeTestDb)

const NODE_PORTS = [1, 2, 3].map((n) => Number(process.env[`CLUSTER_NODE${n}_PORT`] ?? 4400 + n))

/** Polls every node until `sql` answers a count of `expected` on each (replication is not instant on the others). */
async function onEveryNode(sql: string, params: unknown[], expected: number): Promise<void> {
  for (const port of NODE_PORTS) {
    const connection = await createConnection({ host: '127.0.0.1', port, user: process.env.DB_USER, password: process.env.DB_PASSWORD, database: process.env.DB_NAME })
    try {
      await waitFor(async () => {
        const [rows] = await connection.query(sql, params)
        return Number((rows as Array<{ n: number }>)[0]!.n) === expected
      }, `${expected} rows on the node at port ${port}`, 30_000)
    } finally {
      await connection.end()
    }
  }
}

describe('write paths on the Galera cluster', () => {
  it('registers a patient, and every node has it', async () => {
    const email = `cluster-${Date.now()}@fernhollow.test`
    const created = await manager.post('/api/patients', { firstName: 'Ida', lastName: 'Clusterton', dateOfBirth: '1985-04-03', email, emailConsent: true })
    expect(created.status).toBe(201)
    await onEveryNode('SELECT COUNT(*) AS n FROM patients WHERE email = ?', [email], 1)
  })

  it('saves shifts one at a time per provider: of two clashing saves at two sites at once, one wins', async () => {
    const aspen = await siteIdBySlug('aspen-gulch')
    const saguaro = await siteIdBySlug('saguaro-flats')
    const versions = async () => Number((await testDb()('sites').whereIn('id', [aspen, saguaro]).sum({ v: 'calendar_version' }).first())!.v)
    const versionsBefore = await versions()
    for (let round = 0; round < 5; round += 1) {
      const provider = await createTestProvider(['aspen-gulch', 'saguaro-flats'])
      const body = { providerId: provider.providerId, rrule: 'FREQ=WEEKLY;BYDAY=MO', validFrom: weekdayAhead(2, 1), localStart: '08:00', localEnd: '12:00' }
      const responses = await Promise.all([manager.post('/api/shifts', { ...body, siteId: aspen }), manager.post('/api/shifts', { ...body, siteId: saguaro })])
      expect(statuses(responses), `round ${round + 1}`).toEqual({ 201: 1, 409: 1 })
      await onEveryNode('SELECT COUNT(*) AS n FROM shifts WHERE provider_id = ?', [provider.providerId], 1)
    }
    // Each saved shift's trigger bumped its site's calendar version once; the refused ones rolled back.
    expect(await versions() - versionsBefore).toBe(5)
  })

  it('counts failed sign-ins, also across both app processes', async () => {
    const user = await createTestUser()
    const answers = await Promise.all(Array.from({ length: 4 }, () => new ApiClient(HTTP_URL).post('/api/auth/login', { email: user.email, password: 'not-the-password' })))
    expect(answers.every((answer) => answer.status === 401 || answer.status === 429)).toBe(true)
    const failures = await testDb()('sign_in_attempts').where({ email: user.email, succeeded: false }).count({ n: '*' }).first()
    expect(Number(failures!.n)).toBe(4)
    await onEveryNode('SELECT COUNT(*) AS n FROM sign_in_attempts WHERE email = ? AND succeeded = 0', [user.email], 4)
  })

  it('answers one Idempotency-Key sent twice at once with one visit', async () => {
    const annex = await createAnnex({ rooms: 1, patients: 1 })
    const body = { siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[0], startUtc: utcAt(`${weekdayAhead(6, WEDNESDAY, annex.timeZone)}T10:00`, annex.timeZone), items: FILLING }
    const headers = { 'idempotency-key': `cluster-twice-${annex.siteId}` }
    const second = await clientThroughProxy('manager@fernhollow.test')
    const [a, b] = await Promise.all([manager.post('/api/visits', body, { headers }), second.post('/api/visits', body, { headers })])
    expect([a.status, b.status]).toEqual([201, 201])
    expect(b.body.id).toBe(a.body.id)
    await onEveryNode('SELECT COUNT(*) AS n FROM visits WHERE site_id = ?', [annex.siteId], 1)
  })
})
