// The request bounds of issue 11: dates from 2000-01-01 to today + 3 years, windows, control characters.
import { describe, expect, it } from 'vitest'
import { CONTROL_CHARACTERS, DATE_BOUNDS, dateBoundsProblem, inclusiveDays, instantBoundsProblem, latestAllowedDate } from '../../../../shared/domain/input-bounds'
import { daysFromToday } from '../../../helpers/dates'

describe('date bounds', () => {
  const now = new Date()
  const latest = latestAllowedDate(now)

  it('ends three years after today (UTC)', () => {
    expect(Number(latest.slice(0, 4))).toBe(now.getUTCFullYear() + DATE_BOUNDS.yearsAhead)
    expect(latest >= daysFromToday(3 * 365)).toBe(true)
    expect(latest <= daysFromToday(3 * 366 + 1)).toBe(true)
  })

  it('accepts the first and the last allowed day, refuses the days around them', () => {
    expect(dateBoundsProblem('2000-01-01', now)).toBeNull()
    expect(dateBoundsProblem(latest, now)).toBeNull()
    expect(dateBoundsProblem('1999-12-31', now)).toBe(`must be between 2000-01-01 and ${latest}`)
    expect(dateBoundsProblem('9999-12-31', now)).toBe(`must be between 2000-01-01 and ${latest}`)
  })

  it('holds instants to the same days, whatever their offset', () => {
    expect(instantBoundsProblem(`${latest}T23:59:59Z`, now)).toBeNull()
    expect(instantBoundsProblem(`${latest}T23:59:59-08:00`, now)).not.toBeNull() // the next UTC day
    expect(instantBoundsProblem('9999-12-31T23:50:00Z', now)).not.toBeNull()
    expect(instantBoundsProblem('1999-12-31T23:59:59Z', now)).not.toBeNull()
    expect(instantBoundsProblem('not a date', now)).toBeNull() // the format check answers that one
  })

  it('counts windows in inclusive days', () => {
    expect(inclusiveDays('2027-01-01', '2027-01-01')).toBe(1)
    expect(inclusiveDays('2027-01-01', '2027-04-03')).toBe(93)
    expect(inclusiveDays('2027-01-02', '2027-01-01')).toBe(0)
  })
})

describe('control characters', () => {
  it('finds line breaks, tabs, NUL, DEL, C1 and the Unicode separators, and nothing in ordinary names', () => {
    for (const text of ['a\nb', 'a\rb', 'a\tb', '\u0000', '\u007f', '\u0085', '\u2028', '\u2029']) expect(CONTROL_CHARACTERS.test(text), JSON.stringify(text)).toBe(true)
    for (const text of ['Zoë O\'Brien-Łukasz', 'José María', '李小龍', 'ann@example.test']) expect(CONTROL_CHARACTERS.test(text), text).toBe(false)
  })
})
