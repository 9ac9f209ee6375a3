// Consent follows the contact kept by a merge (issue 16 §2). Consent tied to the address or number it
// was given for: common practice, no source.
import { describe, expect, it } from 'vitest'
import { mergedConsent, type ConsentRecord } from '../../../../shared/domain/merge-consent'

const A: ConsentRecord = { email: 'a@fernhollow.test', guardianEmail: null, phone: '+12095550101', guardianPhone: null, emailConsent: true, smsConsent: true }
const B: ConsentRecord = { email: 'b@fernhollow.test', guardianEmail: null, phone: '+12095550102', guardianPhone: null, emailConsent: false, smsConsent: false }

describe('mergedConsent', () => {
  it('follows the record whose contact is kept by default', () => {
    expect(mergedConsent('email', A, B, {})).toEqual({ from: 'survivor', consent: true, note: null })
    expect(mergedConsent('email', A, B, { email: 'merged' })).toEqual({ from: 'merged', consent: false, note: null })
  })
  it('overrides a consent choice made for another address, with a note for the panel', () => {
    const result = mergedConsent('email', A, B, { email: 'merged', emailConsent: 'survivor' })
    expect(result).toMatchObject({ from: 'merged', consent: false })
    expect(result.note).toBe('E-mail consent follows the e-mail address kept: no, as given with it.')
  })
  it('keeps a choice that covers the contact kept (same address, other spelling)', () => {
    expect(mergedConsent('email', { ...B, email: 'A@Fernhollow.test' }, A, { emailConsent: 'merged' })).toEqual({ from: 'merged', consent: true, note: null })
  })
  it('gives no consent when no record covers every contact kept', () => {
    const guardian: ConsentRecord = { ...B, email: null, guardianEmail: 'g@fernhollow.test', emailConsent: true }
    const result = mergedConsent('email', A, guardian, { guardianEmail: 'merged' })
    expect(result).toMatchObject({ from: 'none', consent: false })
    expect(result.note).toContain('given for another e-mail address than the one kept')
  })
  it('reads numbers by their digits for texts', () => {
    expect(mergedConsent('sms', { ...B, phone: '+1 209 555 0101' }, A, { smsConsent: 'merged' })).toMatchObject({ from: 'merged', consent: true })
    expect(mergedConsent('sms', A, B, { phone: 'merged' })).toMatchObject({ from: 'merged', consent: false })
  })
})
