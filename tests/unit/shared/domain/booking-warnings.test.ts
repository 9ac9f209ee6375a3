// Booking warnings (issue 14): a visit at another site less than an hour before or after, and a
// children's procedure for an adult. Pure: fixed dates are fine here.
import { describe, expect, it } from 'vitest'
import { ageInYears, bookingWarnings, type BookingWarningInput } from '../../../../shared/domain/booking-warnings'

const base: BookingWarningInput = {
  siteId: 1,
  startMs: Date.parse('2026-03-10T17:00:00Z'),
  endMs: Date.parse('2026-03-10T17:45:00Z'),
  visitDate: '2026-03-10',
  patientBirthDate: null,
  procedures: [{ name: 'Adult cleaning', capability: 'hygiene' }],
  otherVisits: [],
}
const other = (siteId: number, startUtc: string, endUtc: string) => ({ siteId, siteName: `Site ${siteId}`, startUtc, endUtc, localStartText: 'a', localEndText: 'b' })

describe('ageInYears', () => {
  it('counts whole years, the birthday itself included', () => {
    expect(ageInYears('1969-03-10', '2026-03-10')).toBe(57)
    expect(ageInYears('1969-03-11', '2026-03-10')).toBe(56)
    expect(ageInYears('2020-12-31', '2026-01-01')).toBe(5)
  })
})

describe('bookingWarnings', () => {
  it('says nothing for an ordinary booking', () => {
    expect(bookingWarnings(base)).toEqual([])
  })

  it('warns of a visit at another site ending less than an hour before', () => {
    const warnings = bookingWarnings({ ...base, otherVisits: [other(2, '2026-03-10T16:00:00Z', '2026-03-10T16:30:00Z')] })
    expect(warnings).toHaveLength(1)
    expect(warnings[0]).toMatch(/Site 2 ending b, less than an hour before/)
  })

  it('warns of one starting less than an hour after, but not of one at the same site or an hour away', () => {
    expect(bookingWarnings({ ...base, otherVisits: [other(2, '2026-03-10T18:15:00Z', '2026-03-10T18:45:00Z')] })[0]).toMatch(/less than an hour after/)
    expect(bookingWarnings({ ...base, otherVisits: [other(1, '2026-03-10T16:00:00Z', '2026-03-10T16:30:00Z')] })).toEqual([])
    expect(bookingWarnings({ ...base, otherVisits: [other(2, '2026-03-10T15:00:00Z', '2026-03-10T16:00:00Z')] })).toEqual([])
  })

  it('warns when a children\'s procedure is booked for an adult (the issue\'s 57-year-old), not for a child', () => {
    const child = { ...base, procedures: [{ name: 'Child cleaning', capability: 'pediatric' as const }] }
    expect(bookingWarnings({ ...child, patientBirthDate: '1969-01-02' })).toEqual(['Child cleaning is a procedure for children, and the patient will be 57.'])
    expect(bookingWarnings({ ...child, patientBirthDate: '2018-05-01' })).toEqual([])
  })
})
