import { readFileSync } from 'node:fs'
import { describe, expect, it } from 'vitest'
import { guessMapping, parseCsv, rowToFields } from '../../../../shared/domain/patient-import'

describe('reading patient CSV files', () => {
  it('drops a BOM, finds semicolons, keeps quoted line breaks and numbers lines as the file does', () => {
    const parsed = parseCsv('\uFEFFGiven;Family;Street\nAna;Lee;"1 Way\nFlat 2"\nBo;Kim;3 Road\n')
    expect(parsed.headers).toEqual(['Given', 'Family', 'Street'])
    expect(parsed.rows).toEqual([['Ana', 'Lee', '1 Way\nFlat 2'], ['Bo', 'Kim', '3 Road']])
    expect(parsed.lines).toEqual([2, 4])
    expect(parseCsv('a,b\n1,2\n').rows).toEqual([['1', '2']])
  })

  it('guesses the mapping from header words and keeps a remembered one that still fits', () => {
    const headers = ['Surname', 'First name', 'DOB', 'E-mail', 'Cell', 'Zip']
    expect(guessMapping(headers)).toEqual({ firstName: 'First name', lastName: 'Surname', dateOfBirth: 'DOB', email: 'E-mail', phone: 'Cell', addressPostalCode: 'Zip' })
    expect(guessMapping(headers, { phone: 'Zip', alertText: 'Gone' }).phone).toBe('Zip')
  })

  it('turns a row into fields or problems in words', () => {
    const headers = ['Given', 'Family', 'Born', 'Phone', 'Street', 'Mail OK', 'Email']
    const mapping = { firstName: 'Given', lastName: 'Family', dateOfBirth: 'Born', phone: 'Phone', addressStreet: 'Street', emailConsent: 'Mail OK', email: 'Email' } as const
    const good = rowToFields(headers, ['Ana', 'Lee', '09/07/1984', '(209) 555-0177', '1 Way\nFlat 2', 'yes', 'ana@fernhollow.test'], mapping, 'day-month-year')
    expect(good).toMatchObject({ ok: true, fields: { dateOfBirth: '1984-07-09', phone: '+12095550177', addressStreet: '1 Way, Flat 2', emailConsent: true, emailConsentSource: 'import' } })
    const bad = rowToFields(headers, ['', 'Lee', '31/02/1984', '555-01', '', 'maybe', ''], mapping, 'day-month-year')
    expect(bad.ok).toBe(false)
    const errors = bad.ok ? [] : bad.errors
    expect(errors.some((error) => error.startsWith('Given name: is required'))).toBe(true)
    expect(errors.some((error) => error.includes('"31/02/1984" is not a date'))).toBe(true)
    expect(errors.some((error) => error.includes('"555-01" is not a phone number'))).toBe(true)
    expect(errors.some((error) => error.includes('"maybe" should be yes or no'))).toBe(true)
  })

  it('reads the demo sample file with its deliberately bad rows', () => {
    const parsed = parseCsv(readFileSync('seeds/sample-patients.csv', 'utf8'))
    const mapping = guessMapping(parsed.headers)
    const results = parsed.rows.map((row) => rowToFields(parsed.headers, row, mapping, 'month-day-year'))
    expect(results.filter((result) => !result.ok)).toHaveLength(4)
  })
})
