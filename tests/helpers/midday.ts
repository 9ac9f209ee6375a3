// A zone where it is late morning right now, so a test can book a visit "today" that starts within the
// hour or a few hours later without crossing midnight, whatever hour the suite runs at.
import { DateTime } from 'luxon'
import { randomUUID } from 'node:crypto'
import { testDb } from './db'
import { hashPasswordOutsideServer } from '../../db/password-hash'

/** An Etc/GMT zone (IANA; the sign is inverted: Etc/GMT+5 is UTC−5) whose local time now is between 11:00 and 12:00. */
export function middayZone(): string {
  const now = DateTime.utc()
  const utcHours = now.hour + now.minute / 60
  let best = 0
  let bestGap = Infinity
  for (let n = -14; n <= 12; n += 1) {
    const local = (((utcHours - n) % 24) + 24) % 24
    const gap = Math.abs(local - 11.5)
    if (gap < bestGap) { best = n; bestGap = gap }
  }
  return best === 0 ? 'Etc/UTC' : best > 0 ? `Etc/GMT+${best}` : `Etc/GMT${best}`
}

/** The next start on a 5-minute grid at least `minutes` from now (negative for the past), in UTC ISO. */
export function startIn(minutes: number): string {
  const ms = Date.now() + minutes * 60_000
  const grid = 5 * 60_000
  return new Date(Math.ceil(ms / grid) * grid).toISOString().replace('.000Z', 'Z')
}

export const STAFF_PASSWORD = 'test-staff-password'

/** A staff account scoped to the given sites; `provider` makes it a provider record too. Returns e-mail and ids. */
export async function createStaff(role: 'dentist' | 'hygienist' | 'assistant' | 'front_desk' | 'manager', siteIds: number[], options: { provider?: boolean } = {}) {
  const db = testDb()
  const tag = randomUUID().slice(0, 8)
  const email = `test-${role.replace('_', '-')}-${tag}@fernhollow.test`
  const [userId] = await db('users').insert({ email, name: `Test ${role} ${tag}`, role, password_hash: await hashPasswordOutsideServer(STAFF_PASSWORD) })
  for (const siteId of siteIds) await db('user_sites').insert({ user_id: userId, site_id: siteId })
  let providerId: number | null = null
  if (options.provider) {
    const [id] = await db('providers').insert({ user_id: userId, capabilities: '["restorative","exam","surgical","preventive","prosthodontic"]' })
    providerId = id as number
  }
  return { email, userId: userId as number, providerId }
}
