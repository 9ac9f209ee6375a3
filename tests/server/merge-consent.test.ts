// Issue 16 §2: a merge keeps consent only for the contact it keeps. Consent to e-mail or texts is given
// for an address or a number (common practice, no source; the TCPA and GDPR tie consent to the
// contact it was given with, from memory): taking one record's e-mail with the other's e-mail consent
// must not claim consent nobody gave for that address. Real MariaDB through the API.
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { randomUUID } from 'node:crypto'
import { signedInAs, type ApiClient } from '../helpers/api-client'
import { closeTestDb, testDb } from '../helpers/db'

let admin: ApiClient
const tag = randomUUID().slice(0, 6)

beforeAll(async () => { admin = await signedInAs('admin@fernhollow.test') })
afterAll(async () => { await closeTestDb() })

async function register(body: Record<string, unknown>) {
  const created = await admin.post('/api/patients', { dateOfBirth: '1984-07-09', lastName: `Consentmerge${tag}`, ...body })
  expect(created.status, JSON.stringify(created.body)).toBe(201)
  return created.body as { id: number } & Record<string, unknown>
}

describe('merge and consent', () => {
  it('does not carry e-mail consent given for another address to the address kept', async () => {
    // The survivor agreed to e-mail at its old address; the other record has a new address, no consent.
    const keep = await register({ firstName: 'Olga', email: `olga.old.${tag}@fernhollow.test`, emailConsent: true })
    const gone = await register({ firstName: 'Olga', email: `olga.new.${tag}@fernhollow.test`, emailConsent: false })
    const merged = await admin.post('/api/patient-merges', { survivorId: keep.id, mergedId: gone.id, take: { email: 'merged', emailConsent: 'survivor' } })
    expect(merged.status, JSON.stringify(merged.body)).toBe(201)
    expect(merged.body.survivor).toMatchObject({ email: `olga.new.${tag}@fernhollow.test`, emailConsent: false, emailConsentAt: null, emailConsentSource: null })
    const row = await testDb()('patients').where({ id: keep.id }).first()
    expect(row).toMatchObject({ email: `olga.new.${tag}@fernhollow.test`, email_consent: 0, email_consent_at: null })
  })

  it('takes the consent given with the address kept, with its date and source, whatever the consent choice', async () => {
    const keep = await register({ firstName: 'Pia', email: `pia.a.${tag}@fernhollow.test`, emailConsent: false })
    const gone = await register({ firstName: 'Pia', email: `pia.b.${tag}@fernhollow.test`, emailConsent: true, emailConsentSource: 'form' })
    const goneRow = await testDb()('patients').where({ id: gone.id }).first()
    const merged = await admin.post('/api/patient-merges', { survivorId: keep.id, mergedId: gone.id, take: { email: 'merged' } })
    expect(merged.status, JSON.stringify(merged.body)).toBe(201)
    expect(merged.body.survivor).toMatchObject({ email: `pia.b.${tag}@fernhollow.test`, emailConsent: true, emailConsentSource: 'form' })
    const row = await testDb()('patients').where({ id: keep.id }).first()
    expect(row.email_consent_at?.getTime()).toBe(goneRow.email_consent_at.getTime())
  })

  it('keeps consent when both records agreed at the same address (case aside), and follows the number for texts', async () => {
    const keep = await register({ firstName: 'Quin', email: `QUIN.${tag}@fernhollow.test`, emailConsent: false, phone: '(209) 555-0161', smsConsent: true })
    const gone = await register({ firstName: 'Quin', email: `quin.${tag}@fernhollow.test`, emailConsent: true, phone: '(209) 555-0162', smsConsent: false })
    // E-mail: the survivor's spelling of the same address; consent from the other record covers it.
    // Texts: the other record's number, whose record never agreed to texts: no text consent.
    const merged = await admin.post('/api/patient-merges', { survivorId: keep.id, mergedId: gone.id, take: { phone: 'merged', emailConsent: 'merged', smsConsent: 'survivor' } })
    expect(merged.status, JSON.stringify(merged.body)).toBe(201)
    expect(merged.body.survivor).toMatchObject({ emailConsent: true, phone: '+12095550162', smsConsent: false, smsConsentAt: null })
  })

  it('drops consent when the kept e-mail and guardian e-mail come from records that each covered only one', async () => {
    const keep = await register({ firstName: 'Rue', email: `rue.${tag}@fernhollow.test`, emailConsent: true })
    const gone = await register({ firstName: 'Rue', guardianName: 'Sol Rue', guardianEmail: `sol.${tag}@fernhollow.test`, emailConsent: true })
    const merged = await admin.post('/api/patient-merges', { survivorId: keep.id, mergedId: gone.id, take: { guardianName: 'merged', guardianEmail: 'merged' } })
    expect(merged.status, JSON.stringify(merged.body)).toBe(201)
    expect(merged.body.survivor).toMatchObject({ email: `rue.${tag}@fernhollow.test`, guardianEmail: `sol.${tag}@fernhollow.test`, emailConsent: false })
  })
})
