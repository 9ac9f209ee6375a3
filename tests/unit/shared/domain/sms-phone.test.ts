// Texts: E.164 numbers (shared/domain/sms-phone.ts).
import { describe, expect, it } from 'vitest'
import { nationalDigitsOf, toE164 } from '../../../../shared/domain/sms-phone'

describe('E.164 numbers (ITU-T E.164: + country code and national number, at most 15 digits)', () => {
  it('reads the ways people write a US number', () => {
    for (const written of ['(209) 555-0148', '209-555-0148', '209.555.0148', '+1 209 555 0148', '1 (209) 555-0148']) {
      expect(toE164(written)).toBe('+12095550148')
    }
    expect(nationalDigitsOf('+12095550148')).toBe('2095550148')
  })

  it('reads a number without a country code in the given country', () => {
    expect(toE164('020 7946 0018', 'GB')).toBe('+442079460018')
  })

  it('gives null for what cannot be a number', () => {
    for (const written of [null, undefined, '', '555-01', 'call me', '1'.repeat(41)]) expect(toE164(written)).toBeNull()
  })
})
