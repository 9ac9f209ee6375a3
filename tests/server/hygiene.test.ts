// Issue 13 §5: a cleaning is worked by the hygienist alone, seating and dismissal included, so the
// default cleaning templates hold the hygienist hands-on for every step but the room reset, and a
// second cleaning for the same hygienist in another room is refused while the first is still being
// seated, cleaned or dismissed (409). Private annex (any week); the demo itself is checked in
// tests/server/demo-visits.test.ts (no hygienist in two rooms at once).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DateTime } from 'luxon'
import { signedInAs, type ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, type Annex } from '../helpers/booking-fixtures'
import { createStaff } from '../helpers/midday'

let annex: Annex
let admin: ApiClient
let hygienistId: number
const CLEANING = [{ templateCode: 'CLEAN-ADULT' }]

beforeAll(async () => {
  annex = await createAnnex({ rooms: 2, providers: 1, patients: 4 })
  admin = await signedInAs('admin@fernhollow.test')
  hygienistId = (await createStaff('hygienist', [annex.siteId], { provider: true })).providerId!
  await testDb()('providers').where({ id: hygienistId }).update({ capabilities: '["hygiene","preventive"]' })
  await testDb()('shifts').insert({ provider_id: hygienistId, site_id: annex.siteId, rrule: 'FREQ=DAILY', valid_from: '2026-01-01', local_start: '00:00', local_end: '24:00' })
})
afterAll(async () => { await closeTestDb() })

const book = (operatoryIndex: number, patientIndex: number, startUtc: string) => admin.post('/api/visits', {
  siteId: annex.siteId, operatoryId: annex.operatoryIds[operatoryIndex], providerId: hygienistId,
  patientId: annex.patientIds[patientIndex], items: CLEANING, startUtc,
})

describe('hygiene visits', () => {
  it('the default cleaning templates keep the hygienist at the chair from seating to dismissal (common practice, no source)', async () => {
    for (const code of ['CLEAN-ADULT', 'CLEAN-CHILD']) {
      const row = await testDb()('procedure_templates').where({ code, is_current: true }).first('steps')
      const steps = (typeof row.steps === 'string' ? JSON.parse(row.steps) : row.steps) as Array<{ kind: string }>
      expect(steps.map((step) => step.kind).filter((kind) => kind !== 'reset'), code).toEqual(steps.filter((step) => step.kind !== 'reset').map(() => 'hands_on'))
    }
  })

  it('a second cleaning for the same hygienist in another room is refused while the first is being dismissed, and fits once it is', async () => {
    const start = DateTime.utc().plus({ days: 3 }).startOf('hour')
    const first = await book(0, 0, start.toISO({ suppressMilliseconds: true })!)
    expect(first.status, JSON.stringify(first.body)).toBe(201)
    const plan = first.body.plan as { segments: Array<{ kind: string; endMinute: number }> }
    const handsOnEnd = Math.max(...plan.segments.filter((segment) => segment.kind === 'hands_on').map((segment) => segment.endMinute))
    // Starting while the first patient is still being dismissed: the hygienist cannot seat the next one.
    const overlapping = await book(1, 1, start.plus({ minutes: handsOnEnd - 5 }).toISO({ suppressMilliseconds: true })!)
    expect(overlapping.status).toBe(409)
    expect(overlapping.body.data.conflict).toMatchObject({ resource: 'provider', id: hygienistId, visitId: first.body.id })
    expect(overlapping.body.message).toMatch(/is already working with another patient from/)
    // During the first room's reset (no provider) the hygienist is free to seat the next patient.
    const next = await book(1, 1, start.plus({ minutes: handsOnEnd }).toISO({ suppressMilliseconds: true })!)
    expect(next.status, JSON.stringify(next.body)).toBe(201)
  })
})
