// The double-booking races through HAProxy to two app processes on the Galera cluster's writer:
// 20 rounds each of 50 requests for one chair and 50 requests for one provider's hands-on time.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt, type Annex } from '../helpers/booking-fixtures'
import { MONDAY, TUESDAY, weekdayAhead } from '../helpers/dates'
import { overlapCounts } from '../helpers/overlaps'
import { clientThroughProxy, statuses } from './cluster'

const ROUNDS = 20
let annex: Annex
let clients: ApiClient[]

beforeAll(async () => {
  annex = await createAnnex({ rooms: 50, providers: 3, patients: 100 })
  clients = await Promise.all(Array.from({ length: 5 }, () => clientThroughProxy('admin@fernhollow.test')))
})
afterAll(closeTestDb)

function at(weekday: number, round: number): string {
  // An annex site is open around the clock: a filling takes 65 minutes, so two hours per round,
  // ten rounds a day, on days of their own per race (Monday and Wednesday, or Tuesday and Thursday).
  const hour = String(1 + 2 * (round % 10)).padStart(2, '0')
  return utcAt(`${weekdayAhead(3, weekday + 2 * Math.floor(round / 10), annex.timeZone)}T${hour}:00`, annex.timeZone)
}

describe('races through HAProxy on the Galera cluster', () => {
  it(`50 requests for one chair at one time, ${ROUNDS} rounds: exactly one wins each round`, async () => {
    for (let round = 0; round < ROUNDS; round += 1) {
      const startUtc = at(MONDAY, round)
      const responses = await Promise.all(Array.from({ length: 50 }, (_, index) => clients[index % 5]!.post('/api/visits', {
        siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[index % 3],
        patientId: annex.patientIds[index], startUtc, items: FILLING,
      })))
      expect(statuses(responses), `round ${round + 1}`).toEqual({ 201: 1, 409: 49 })
    }
    const booked = await testDb()('visits').where({ site_id: annex.siteId, operatory_id: annex.operatoryIds[0] }).count({ n: '*' }).first()
    expect(Number(booked!.n)).toBe(ROUNDS)
  })

  it(`50 requests in 50 chairs for one provider's hands-on time, ${ROUNDS} rounds: exactly one wins each round`, async () => {
    for (let round = 0; round < ROUNDS; round += 1) {
      const startUtc = at(TUESDAY, round)
      const responses = await Promise.all(Array.from({ length: 50 }, (_, index) => clients[index % 5]!.post('/api/visits', {
        siteId: annex.siteId, operatoryId: annex.operatoryIds[index], providerId: annex.providerIds[0],
        patientId: annex.patientIds[50 + index], startUtc, items: FILLING,
      })))
      expect(statuses(responses), `round ${round + 1}`).toEqual({ 201: 1, 409: 49 })
    }
    const starts = Array.from({ length: ROUNDS }, (_, round) => new Date(at(TUESDAY, round)))
    const booked = await testDb()('visits').where({ site_id: annex.siteId, provider_id: annex.providerIds[0] }).whereIn('start_utc', starts)
      .count({ n: '*' }).first()
    expect(Number(booked!.n)).toBe(ROUNDS)
  })

  it('leaves no overlapping chair, hands-on provider or patient segments anywhere in the database', async () => {
    expect(await overlapCounts(testDb())).toEqual({ chairs: 0, handsOn: 0, patients: 0 })
  })
})
