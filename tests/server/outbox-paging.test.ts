// GET /api/outbox: searching by patient (name or e-mail) and paging with `beforeId` (issue 14).
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedInAs, type ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { bookingFor, createMailAnnex, type MailAnnex } from '../helpers/mail-fixtures'
import { atAhead, MONDAY, TUESDAY, WEDNESDAY } from '../helpers/dates'

let manager: ApiClient
let annex: MailAnnex
let lastName: string

beforeAll(async () => {
  annex = await createMailAnnex({ patients: 3, mailLane: 'outbox-paging' })
  manager = await signedInAs('manager@fernhollow.test')
  lastName = (await testDb()('patients').where({ id: annex.patientIds[0] }).first()).last_name
  await testDb()('patients').where({ id: annex.patientIds[1] }).update({ first_name: 'Odalys', last_name: `Quenby ${lastName}` })
  for (const [index, weekday] of [MONDAY, TUESDAY, WEDNESDAY].entries()) {
    const booked = await manager.post('/api/visits', bookingFor(annex, index, atAhead(4, weekday, '10:00', annex.timeZone)))
    expect(booked.status).toBe(201)
  }
})
afterAll(closeTestDb)

describe('outbox paging', () => {
  it('pages newest first with beforeId, without gaps or repeats', async () => {
    const all = (await manager.get(`/api/outbox?siteId=${annex.siteId}&limit=500`)).body as Array<{ id: number }>
    expect(all.length).toBeGreaterThanOrEqual(6)
    const seen: number[] = []
    let beforeId: number | undefined
    for (;;) {
      const page = await manager.get(`/api/outbox?siteId=${annex.siteId}&limit=2${beforeId ? `&beforeId=${beforeId}` : ''}`)
      expect(page.status).toBe(200)
      const ids = (page.body as Array<{ id: number }>).map((message) => message.id)
      expect(ids.length).toBeLessThanOrEqual(2)
      seen.push(...ids)
      if (ids.length < 2) break
      beforeId = ids.at(-1)
    }
    expect(seen).toEqual(all.map((message) => message.id))
    expect([...seen].sort((a, b) => b - a)).toEqual(seen)
  })

  it.each([
    ['a limit above the most one page holds', 'limit=501', 'limit'],
    ['a cursor that is not an id', 'beforeId=abc', 'beforeId'],
    ['a one-letter search', 'patient=a', 'patient'],
    ['a search with a line break', 'patient=ab%0Acd', 'patient'],
  ])('answers %s with 400 naming the field', async (_case, query, field) => {
    const response = await manager.get(`/api/outbox?siteId=${annex.siteId}&${query}`)
    expect(response.status).toBe(400)
    expect(response.body.data.field).toBe(field)
  })
})

describe('outbox search by patient', () => {
  it('finds a patient by e-mail, part of it included', async () => {
    const found = (await manager.get(`/api/outbox?siteId=${annex.siteId}&patient=${encodeURIComponent(annex.emails[2]!)}`)).body as Array<{ recipient: string }>
    expect(found.length).toBeGreaterThan(0)
    expect(found.every((message) => message.recipient === annex.emails[2])).toBe(true)
  })

  it('finds patients by the start of each word of their name', async () => {
    const odalys = (await manager.get(`/api/outbox?siteId=${annex.siteId}&patient=odal`)).body as Array<{ patientName: string }>
    expect(odalys.length).toBeGreaterThan(0)
    expect(new Set(odalys.map((message) => message.patientName))).toEqual(new Set([`Odalys Quenby ${lastName}`]))
    const both = (await manager.get(`/api/outbox?siteId=${annex.siteId}&patient=${encodeURIComponent(`Quenby Odalys`)}`)).body as unknown[]
    expect(both.length).toBe(odalys.length)
    expect((await manager.get(`/api/outbox?siteId=${annex.siteId}&patient=Zzyzx`)).body).toEqual([])
  })

  it('reads % and _ as letters, not wildcards', async () => {
    expect((await manager.get(`/api/outbox?siteId=${annex.siteId}&patient=${encodeURIComponent('%%')}`)).body).toEqual([])
  })
})
