// Set-up for tests that need a real visit of the demo dentist: the site's notice and hours opened
// up for today, an extra shift when the dentist would not be working, and booking the first opening.
import { DateTime } from 'luxon'
import { testDb } from './db'
import type { ApiClient } from './api-client'
import { FILLING } from './booking-fixtures'

export async function demoDentistProviderId(): Promise<number> {
  const row = await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('users.email', 'dentist@fernhollow.test').first('providers.id')
  return row.id
}

/** JSON columns may come back as text or already parsed, depending on the driver's type casting. */
function parsed<T>(value: unknown, fallback: T): T {
  if (value === null || value === undefined) return fallback
  return (typeof value === 'string' ? JSON.parse(value) : value) as T
}

/** Minimum notice 0 and today open around the clock at the site; returns the undo. */
export async function openSiteForToday(siteId: number, zone: string): Promise<() => Promise<void>> {
  const site = await testDb()('sites').where({ id: siteId }).first('settings', 'opening_hours', 'closed_dates')
  const today = DateTime.now().setZone(zone)
  const original = {
    settings: parsed<Record<string, unknown>>(site.settings, {}),
    opening_hours: parsed<Record<string, unknown>>(site.opening_hours, {}),
    closed_dates: parsed<string[]>(site.closed_dates, []),
  }
  await testDb()('sites').where({ id: siteId }).update({
    settings: JSON.stringify({ ...original.settings, minimumNoticeMinutes: 0 }),
    opening_hours: JSON.stringify({ ...original.opening_hours, [String(today.weekday)]: [{ start: '00:00', end: '24:00' }] }),
    closed_dates: JSON.stringify(original.closed_dates.filter((date) => date !== today.toISODate())),
  })
  return async () => {
    await testDb()('sites').where({ id: siteId }).update({
      settings: JSON.stringify(original.settings), opening_hours: JSON.stringify(original.opening_hours), closed_dates: JSON.stringify(original.closed_dates),
    })
  }
}

/** An 'extra' shift today from this hour for three hours (ending before midnight), unless already on shift then. */
export async function ensureOnShiftNow(client: ApiClient, providerId: number, siteId: number, zone: string): Promise<number | null> {
  const now = DateTime.now().setZone(zone)
  const today = now.toISODate()!
  const rota = await client.get(`/api/rota?providerId=${providerId}&from=${today}&to=${today}`)
  if (rota.status !== 200) throw new Error(`rota: ${rota.status} ${JSON.stringify(rota.body)}`)
  const until = now.plus({ hours: 2 }).toMillis()
  const covered = rota.body.entries.some((entry: { kind: string; siteId: number; startUtc: string; endUtc: string }) =>
    (entry.kind === 'shift' || entry.kind === 'extra') && entry.siteId === siteId
    && Date.parse(entry.startUtc) <= now.toMillis() && Date.parse(entry.endUtc) >= until)
  if (covered) return null
  const end = now.plus({ hours: 3 })
  const [id] = await testDb()('shift_exceptions').insert({
    provider_id: providerId, site_id: siteId, kind: 'extra', start_date: today, end_date: today,
    local_start: now.toFormat('HH:00'), local_end: end.toISODate() === today ? end.toFormat('HH:mm') : '23:55', reason: 'My day test',
  })
  return id as number
}

/** Books the first opening of a two-surface filling for the provider at the site between two local dates. */
export async function bookFirstOpening(client: ApiClient, options: { siteId: number; providerId: number; from: string; to: string; patientOffset: number; note?: string }) {
  const search = await client.post('/api/openings', { items: FILLING, siteIds: [options.siteId], providerId: options.providerId, from: options.from, to: options.to, limit: 1 })
  if (search.status !== 200 || !search.body.openings.length) throw new Error(`no opening: ${search.status} ${JSON.stringify(search.body.reasons ?? search.body)}`)
  const opening = search.body.openings[0]
  const patient = await testDb()('patients').orderBy('id').offset(options.patientOffset).first('id', 'first_name', 'last_name')
  const booked = await client.post('/api/appointments', {
    patientId: patient.id, siteId: options.siteId, operatoryId: opening.operatoryId, providerId: options.providerId,
    startUtc: opening.startUtc, items: FILLING, note: options.note ?? '',
  })
  if (booked.status !== 201) throw new Error(`booking failed: ${booked.status} ${JSON.stringify(booked.body)}`)
  return { visit: booked.body, opening, patientName: `${patient.first_name} ${patient.last_name}` }
}
