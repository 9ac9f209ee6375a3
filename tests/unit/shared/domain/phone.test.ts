import { describe, expect, it } from 'vitest'
import { formatPhone, toE164 } from '../../../../shared/domain/phone'

// E.164 is ITU-T Recommendation E.164 (+, country code, national number, no spaces); libphonenumber-js
// holds the numbering plans. 555-01xx numbers are set aside for fiction in the North American plan.
describe('phones', () => {
  it('reads national and international forms into E.164', () => {
    for (const typed of ['(209) 555-0177', '209-555-0177', '209.555.0177', '+1 209 555 0177', '1 (209) 555-0177']) {
      expect(toE164(typed)).toBe('+12095550177')
    }
    expect(toE164('+44 20 7946 0958')).toBe('+442079460958')
  })

  it('refuses what is not a phone number', () => {
    for (const typed of ['555-0101', '12', 'call me', '', '+1 000 000 0000']) expect(toE164(typed)).toBeNull()
  })

  it('shows the default country nationally and any other internationally', () => {
    expect(formatPhone('+12095550177')).toBe('(209) 555-0177')
    expect(formatPhone('+442079460958')).toBe('+44 20 7946 0958')
    expect(formatPhone(null)).toBe('')
  })
})
