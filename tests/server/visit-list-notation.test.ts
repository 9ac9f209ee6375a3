// The visit list writes teeth in the visit's site's notation (BoardVisitDto.procedures): Universal at a
// Universal site, ISO 3950 at an ISO site. Universal 19 and ISO 36 are the same tooth, the permanent
// mandibular left first molar (ISO 3950; Universal numbering as the ADA lists it).
import { afterAll, describe, expect, it } from 'vitest'
import { signedInAs } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'
import { createAnnex, FILLING, utcAt } from '../helpers/booking-fixtures'
import { WEDNESDAY, weekdayAhead } from '../helpers/dates'

afterAll(closeTestDb)

async function listedProcedures(notation: 'universal' | 'iso'): Promise<string[]> {
  const annex = await createAnnex({ rooms: 1, patients: 1, timeZone: 'Europe/Berlin' })
  await testDb()('sites').where({ id: annex.siteId }).update({ tooth_notation: notation })
  const admin = await signedInAs('admin@fernhollow.test')
  const date = weekdayAhead(3, WEDNESDAY, annex.timeZone)
  const booked = await admin.post('/api/visits', {
    patientId: annex.patientIds[0], siteId: annex.siteId, operatoryId: annex.operatoryIds[0], providerId: annex.providerIds[0],
    startUtc: utcAt(`${date}T10:00`, annex.timeZone), items: FILLING,
  })
  expect(booked.status).toBe(201)
  const from = encodeURIComponent(utcAt(`${date}T00:00`, annex.timeZone))
  const to = encodeURIComponent(utcAt(`${date}T23:59`, annex.timeZone))
  const listed = await admin.get(`/api/visits?siteId=${annex.siteId}&fromUtc=${from}&toUtc=${to}`)
  expect(listed.status).toBe(200)
  return listed.body.find((visit: { id: number }) => visit.id === booked.body.id).procedures
}

describe('GET /api/visits: tooth numbers in the site\'s notation', () => {
  it('writes the tooth in ISO 3950 at a site that uses it', async () => {
    expect(await listedProcedures('iso')).toEqual(['Posterior composite 36 MO'])
  })
  it('writes the same tooth in Universal at a site that uses Universal', async () => {
    expect(await listedProcedures('universal')).toEqual(['Posterior composite 19 MO'])
  })
})
