// The app keeps each site's calendar in memory, keyed by sites.calendar_version that triggers move
// on every room, shift, exception and block change. A change made by any path (here plain SQL, not
// even the app) must reach the next booking; the booking's share lock on the site row orders rota
// changes after bookings in flight.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { Knex } from 'knex'
import { type ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, type Annex } from '../helpers/booking-fixtures'
import { createDb, dbSettingsFromEnv } from '../../db/connection'
import { atAhead, weekdayAhead, MONDAY, TUESDAY, WEDNESDAY, THURSDAY, SATURDAY } from '../helpers/dates'

let manager: ApiClient
let annex: Annex

async function versionOf(siteId: number): Promise<number> {
  const row = await testDb()('sites').where({ id: siteId }).first('calendar_version')
  return Number(row.calendar_version)
}

function visitAt(weekday: number, time: string, patientIndex: number) {
  return {
    siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0], patientId: annex.patientIds[patientIndex],
    startUtc: atAhead(2, weekday, time, annex.timeZone), items: FILLING,
  }
}

beforeAll(async () => {
  manager = await signedInAs('manager@fernhollow.test')
  annex = await createAnnex({ rooms: 2, providers: 1, patients: 4 })
})
afterAll(closeTestDb)

describe('calendar version triggers', () => {
  it('move on shift, block, exception and room changes, but not on the booking lock of a room', async () => {
    const { siteId } = annex
    let seen = await versionOf(siteId)
    const moved = async () => {
      const now = await versionOf(siteId)
      const changed = now !== seen
      seen = now
      return changed
    }
    await testDb()('operatories').where({ id: annex.operatoryIds[0] }).increment('booking_seq', 1)
    expect(await moved()).toBe(false)
    await testDb()('operatories').where({ id: annex.operatoryIds[0] }).update({ name: 'Room one (renamed)' })
    expect(await moved()).toBe(true)
    const [blockId] = await testDb()('blocks').insert({ site_id: siteId, operatory_id: annex.operatoryIds[1], start_date: weekdayAhead(2, MONDAY), local_start: '08:00', local_end: '09:00', reason: 'Repair' })
    expect(await moved()).toBe(true)
    await testDb()('blocks').where({ id: blockId }).delete()
    expect(await moved()).toBe(true)
    await testDb()('shifts').where({ provider_id: annex.providerIds[0], site_id: siteId }).update({ local_end: '23:00' })
    expect(await moved()).toBe(true)
    // An exception with no site applies everywhere: every site's version moves.
    const otherSite = await testDb()('sites').whereNot({ id: siteId }).first('id', 'calendar_version')
    await testDb()('shift_exceptions').insert({ provider_id: annex.providerIds[0], site_id: null, kind: 'time_off', start_date: weekdayAhead(3, THURSDAY), end_date: weekdayAhead(3, THURSDAY) })
    expect(await moved()).toBe(true)
    expect(await versionOf(otherSite.id)).toBe(Number(otherSite.calendar_version) + 1)
  })
})

describe('bookings see rota changes at once', () => {
  it('refuses a newly blocked chair and a removed shift right after a booking loaded the calendar', async () => {
    expect((await manager.post('/api/visits', visitAt(TUESDAY, '09:00', 0))).status).toBe(201)
    // Written straight to the database, past the app: the triggers alone must make it seen.
    await testDb()('blocks').insert({ site_id: annex.siteId, operatory_id: annex.operatoryIds[0], start_date: weekdayAhead(2, TUESDAY, annex.timeZone), local_start: '13:00', local_end: '15:00', reason: 'Compressor repair' })
    const blocked = await manager.post('/api/visits', visitAt(TUESDAY, '13:30', 1))
    expect(blocked.status).toBe(409)
    expect(blocked.body.data.conflict).toMatchObject({ resource: 'operatory', id: annex.operatoryIds[0] })

    await testDb()('shifts').where({ provider_id: annex.providerIds[0], site_id: annex.siteId }).update({ valid_until: weekdayAhead(2, TUESDAY, annex.timeZone) })
    const afterShiftEnds = await manager.post('/api/visits', visitAt(WEDNESDAY, '09:00', 2))
    expect(afterShiftEnds.status).toBe(409)
    expect(afterShiftEnds.body.data.conflict).toMatchObject({ resource: 'provider', id: annex.providerIds[0] })
  })
})

describe('database sessions', () => {
  let second: Knex
  beforeAll(() => {
    second = createDb({ ...dbSettingsFromEnv(), poolMax: 2 })
  })
  afterAll(async () => {
    await second.destroy()
  })

  it('read DATE columns as the stored calendar date and DATETIME columns as UTC instants', async () => {
    await second.transaction(async (trx) => {
      // A session zone far from UTC: neither kind of column may move with it.
      await trx.raw("SET time_zone = '+09:00'")
      const [rows] = await trx.raw("SELECT CAST('2026-03-08' AS DATE) AS day, CAST('2026-03-08 02:30:00' AS DATETIME) AS instant")
      expect(rows[0].day).toBe('2026-03-08')
      expect(rows[0].instant).toEqual(new Date('2026-03-08T02:30:00Z'))
    })
    const shift = await testDb()('shifts').first('valid_from')
    expect(shift.valid_from).toMatch(/^\d{4}-\d{2}-\d{2}$/)
  })

  it('run transactions at READ COMMITTED by default (the booking transaction relies on it)', async () => {
    await second.transaction(async (trx) => {
      const [rows] = await trx.raw('SELECT @@tx_isolation AS level')
      expect(rows[0].level).toBe('READ-COMMITTED')
    })
  })

  it('make a rota change wait while a booking holds the site row in share mode', async () => {
    const booking = await testDb().transaction()
    try {
      await booking('sites').where({ id: annex.siteId }).forShare().first('id')
      const attempt = second.transaction(async (trx) => {
        await trx.raw('SET SESSION innodb_lock_wait_timeout = 1')
        await trx('blocks').insert({ site_id: annex.siteId, start_date: weekdayAhead(4, SATURDAY), local_start: '08:00', local_end: '09:00', reason: 'Staff meeting' })
      })
      await expect(attempt).rejects.toMatchObject({ errno: 1205 })
    } finally {
      await booking.rollback()
    }
  })
})
