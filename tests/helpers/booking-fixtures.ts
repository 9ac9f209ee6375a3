// Test-only sites and people, so concurrency tests never touch the demo's calendar.
import { randomUUID } from 'node:crypto'
import { DateTime } from 'luxon'
import { testDb } from './db'
import { hashPasswordOutsideServer } from '../../db/password-hash'

const ALL_DAY = [{ start: '00:00', end: '24:00' }]

export interface Annex {
  siteId: number
  timeZone: string
  operatoryIds: number[]
  providerIds: number[]
  patientIds: number[]
}

/** A site open around the clock with `rooms` restorative chairs, providers on shift every day, and patients. */
export async function createAnnex(options: { rooms: number; providers?: number; patients: number; timeZone?: string }): Promise<Annex> {
  const db = testDb()
  const tag = randomUUID().slice(0, 8)
  const timeZone = options.timeZone ?? 'America/Chicago'
  const [siteId] = await db('sites').insert({
    name: `Test annex ${tag}`, slug: `annex-${tag}`, time_zone: timeZone, booking_unit_minutes: 5,
    opening_hours: JSON.stringify({ 1: ALL_DAY, 2: ALL_DAY, 3: ALL_DAY, 4: ALL_DAY, 5: ALL_DAY, 6: ALL_DAY, 7: ALL_DAY }),
    closed_dates: '[]', settings: JSON.stringify({ minimumNoticeMinutes: 0 }),
  })
  const operatoryIds: number[] = []
  for (let index = 0; index < options.rooms; index += 1) {
    const [id] = await db('operatories').insert({ site_id: siteId, name: `Room ${index + 1}`, capabilities: '["restorative","hygiene","surgical","imaging","pediatric"]', sort_order: index })
    operatoryIds.push(id as number)
  }
  const providerIds: number[] = []
  const hash = await hashPasswordOutsideServer('annex-provider-password')
  for (let index = 0; index < (options.providers ?? 1); index += 1) {
    const [userId] = await db('users').insert({ email: `test-dentist-${tag}-${index}@fernhollow.test`, name: `Dr. Annex ${tag}-${index}`, role: 'dentist', password_hash: hash })
    await db('user_sites').insert({ user_id: userId, site_id: siteId })
    const [providerId] = await db('providers').insert({ user_id: userId, capabilities: '["restorative","exam","surgical","preventive","prosthodontic"]' })
    await db('shifts').insert({ provider_id: providerId, site_id: siteId, rrule: 'FREQ=DAILY', valid_from: '2026-01-01', local_start: '00:00', local_end: '24:00' })
    providerIds.push(providerId as number)
  }
  const patientIds: number[] = []
  for (let index = 0; index < options.patients; index += 1) {
    const [id] = await db('patients').insert({ first_name: `Annex${index}`, last_name: `Patient ${tag}`, date_of_birth: '1980-01-01', email_consent: false })
    patientIds.push(id as number)
  }
  return { siteId: siteId as number, timeZone, operatoryIds, providerIds, patientIds }
}

/** A local wall time in a zone, as the UTC instant the API takes. */
export function utcAt(localDateTime: string, zone: string): string {
  return DateTime.fromISO(localDateTime, { zone }).toUTC().toISO({ suppressMilliseconds: true })!
}

export const FILLING = [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO' }]
