// Set-up for tests that need a real visit of the demo dentist: booking the first opening of a day.
import { testDb } from './db'
import type { ApiClient } from './api-client'
import { FILLING } from './booking-fixtures'

export async function demoDentistProviderId(): Promise<number> {
  const row = await testDb()('providers').join('users', 'users.id', 'providers.user_id').where('users.email', 'dentist@fernhollow.test').first('providers.id')
  return row.id
}

/** Books the first opening of a two-surface filling for the provider at the site between two local dates. */
export async function bookFirstOpening(client: ApiClient, options: { siteId: number; providerId: number; from: string; to: string; patientOffset: number; note?: string }) {
  const search = await client.post('/api/openings', { items: FILLING, siteIds: [options.siteId], providerId: options.providerId, from: options.from, to: options.to, limit: 1 })
  if (search.status !== 200 || !search.body.openings.length) throw new Error(`no opening: ${search.status} ${JSON.stringify(search.body.reasons ?? search.body)}`)
  const opening = search.body.openings[0]
  const patient = await testDb()('patients').orderBy('id').offset(options.patientOffset).first('id', 'first_name', 'last_name')
  const booked = await client.post('/api/visits', {
    patientId: patient.id, siteId: options.siteId, operatoryId: opening.operatoryId, providerId: options.providerId,
    startUtc: opening.startUtc, items: FILLING, note: options.note ?? '',
  })
  if (booked.status !== 201) throw new Error(`booking failed: ${booked.status} ${JSON.stringify(booked.body)}`)
  return { visit: booked.body, opening, patientName: `${patient.first_name} ${patient.last_name}` }
}
