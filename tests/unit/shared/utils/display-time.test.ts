// The one formatter for times and dates people read (issue 14): each site's clock and date order.
// Fixed dates on purpose: the formatter is pure and is handed its instants.
import { describe, expect, it } from 'vitest'
import type { DisplayStyle } from '../../../../shared/types/display'
import {
  dateInputHint, displayStyleOf, formatDate, formatDateTime, formatLocalDate, formatRange, formatTime, formatTimeRange, formatWallTime, parseDateInput,
  weekDays, weekLabelOf, zoneLabel, zoneLongName,
} from '../../../../shared/utils/display-time'

const US: DisplayStyle = { timeZone: 'America/Los_Angeles', clock: '12h', dateOrder: 'month-day-year' }
const DAY_FIRST_24: DisplayStyle = { timeZone: 'America/Denver', clock: '24h', dateOrder: 'day-month-year' }
const ISO_ORDER: DisplayStyle = { timeZone: 'America/Phoenix', clock: '24h', dateOrder: 'year-month-day' }
// 17:05 UTC on Tuesday 1 December 2026: 09:05 in Los Angeles (UTC−8), 10:05 in Denver and Phoenix (UTC−7).
const INSTANT = '2026-12-01T17:05:00Z'

describe('times on the site clock', () => {
  it('shows a 12-hour clock with AM/PM and a 24-hour clock with two-digit hours', () => {
    expect(formatTime(INSTANT, US)).toBe('9:05 AM')
    expect(formatTime(INSTANT, DAY_FIRST_24)).toBe('10:05')
    expect(formatTime(Date.parse('2026-12-01T20:00:00Z'), US)).toBe('12:00 PM')
    expect(formatTime(new Date('2026-12-01T08:30:00Z'), US)).toBe('12:30 AM')
  })

  it('shows wall-clock times of shifts and opening hours, midnight at the end of a day included', () => {
    expect(formatWallTime('07:30', US)).toBe('7:30 AM')
    expect(formatWallTime('16:00', US)).toBe('4:00 PM')
    expect(formatWallTime('24:00', US)).toBe('12:00 AM')
    expect(formatWallTime('07:30', DAY_FIRST_24)).toBe('07:30')
  })
})

describe('dates in the site order', () => {
  it('writes a numeric date month first, day first or year first', () => {
    expect(formatLocalDate('1973-09-13', US, 'numeric')).toBe('09/13/1973')
    expect(formatLocalDate('1973-09-13', DAY_FIRST_24, 'numeric')).toBe('13/09/1973')
    expect(formatLocalDate('1973-09-13', ISO_ORDER, 'numeric')).toBe('1973-09-13')
  })

  it('writes dates with words in each order', () => {
    expect(formatDate(INSTANT, US, 'long')).toBe('Tuesday, December 1, 2026')
    expect(formatDate(INSTANT, DAY_FIRST_24, 'long')).toBe('Tuesday 1 December 2026')
    expect(formatDate(INSTANT, ISO_ORDER, 'long')).toBe('Tuesday 2026-12-01')
    expect(formatDate(INSTANT, US, 'short')).toBe('Tue, Dec 1')
    expect(formatDate(INSTANT, DAY_FIRST_24, 'medium')).toBe('1 Dec 2026')
  })

  it('takes the date in the site zone, not UTC', () => {
    // 03:00 UTC on 2 December is still 1 December in Los Angeles.
    expect(formatDate('2026-12-02T03:00:00Z', US, 'numeric')).toBe('12/01/2026')
  })
})

describe('date and time together', () => {
  it('joins date and time, with "at" in the long form e-mails use', () => {
    expect(formatDateTime(INSTANT, US)).toBe('Tue, Dec 1, 9:05 AM')
    expect(formatDateTime(INSTANT, US, 'long')).toBe('Tuesday, December 1, 2026 at 9:05 AM')
    expect(formatDateTime(INSTANT, DAY_FIRST_24)).toBe('Tue 1 Dec, 10:05')
  })

  it('shows a range on one date once, and both dates for a range across midnight', () => {
    expect(formatTimeRange(INSTANT, '2026-12-01T18:30:00Z', US)).toBe('9:05 AM–10:30 AM')
    expect(formatRange(INSTANT, '2026-12-01T18:30:00Z', DAY_FIRST_24)).toBe('Tue 1 Dec, 10:05–11:30')
    // A range ending exactly at local midnight stays on its date.
    expect(formatRange('2026-12-02T07:00:00Z', '2026-12-02T08:00:00Z', US)).toBe('Tue, Dec 1, 11:00 PM–12:00 AM')
    expect(formatRange('2026-12-02T07:00:00Z', '2026-12-02T09:00:00Z', US)).toBe('Tue, Dec 1, 11:00 PM – Wed, Dec 2, 1:00 AM')
  })
})

describe('typed dates', () => {
  it('reads the site order and ISO, and refuses impossible dates', () => {
    expect(parseDateInput('09/13/1973', 'month-day-year')).toBe('1973-09-13')
    expect(parseDateInput('9/3/1973', 'month-day-year')).toBe('1973-09-03')
    expect(parseDateInput('13.09.1973', 'day-month-year')).toBe('1973-09-13')
    expect(parseDateInput('1973-09-13', 'day-month-year')).toBe('1973-09-13')
    expect(parseDateInput('1973/9/13', 'year-month-day')).toBe('1973-09-13')
    expect(parseDateInput('13/09/1973', 'month-day-year')).toBeNull()
    expect(parseDateInput('02/30/2024', 'month-day-year')).toBeNull()
    expect(parseDateInput('09/13/73', 'month-day-year')).toBeNull()
    expect(parseDateInput('Sep 13', 'month-day-year')).toBeNull()
  })

  it('names the format a field expects', () => {
    expect(dateInputHint('month-day-year')).toBe('MM/DD/YYYY')
    expect(dateInputHint('day-month-year')).toBe('DD/MM/YYYY')
    expect(dateInputHint('year-month-day')).toBe('YYYY-MM-DD')
  })
})

describe('zone names', () => {
  // Offsets from the IANA time zone database (check-values.md: America/Los_Angeles −08:00 / −07:00,
  // America/Denver −07:00 / −06:00, America/Phoenix −07:00 all year).
  it('names the zone as people say it, with its offset that day (U+2212 minus)', () => {
    expect(zoneLabel('America/Los_Angeles', Date.parse(INSTANT))).toBe('Pacific time, UTC\u22128')
    expect(zoneLabel('America/Los_Angeles', Date.parse('2026-07-01T12:00:00Z'))).toBe('Pacific time, UTC\u22127')
    expect(zoneLabel('America/Denver', Date.parse(INSTANT))).toBe('Mountain time, UTC\u22127')
    expect(zoneLabel('America/Phoenix', Date.parse('2026-07-01T12:00:00Z'))).toBe('Mountain time, UTC\u22127')
  })
})

describe('week labels in the site\'s date order (Rota, Week views)', () => {
  it('labels the seven days short in each order and marks today', () => {
    const days = weekDays('2027-03-15', US, '2027-03-17')
    expect(days.map((day) => day.date)).toEqual(['2027-03-15', '2027-03-16', '2027-03-17', '2027-03-18', '2027-03-19', '2027-03-20', '2027-03-21'])
    expect(days.map((day) => [day.label, day.today])[2]).toEqual(['Wed, Mar 17', true])
    expect(weekDays('2027-03-15', DAY_FIRST_24)[2]!.label).toBe('Wed 17 Mar')
    expect(weekDays('2027-03-15', ISO_ORDER)[2]!.label).toBe('Wed 2027-03-17')
    expect(weekDays('2027-03-15', US).some((day) => day.today)).toBe(false)
  })
  it('names a week across the new year with the year of its last day', () => {
    expect(weekLabelOf('2027-12-27', US)).toBe('Dec 27 – Jan 2, 2028')
    expect(weekLabelOf('2027-12-27', DAY_FIRST_24)).toBe('27 Dec – 2 Jan 2028')
    expect(weekLabelOf('2027-12-27', ISO_ORDER)).toBe('2027-12-27 – 2028-01-02')
  })
})

describe('a site\'s style and its zone\'s name', () => {
  it('takes the style from a site row, or the defaults in a given zone', () => {
    expect(displayStyleOf({ ...DAY_FIRST_24, name: 'a site' } as typeof DAY_FIRST_24)).toEqual(DAY_FIRST_24)
    expect(displayStyleOf(undefined, 'Pacific/Auckland')).toEqual({ timeZone: 'Pacific/Auckland', clock: '12h', dateOrder: 'month-day-year' })
    expect(displayStyleOf(null)).toMatchObject({ timeZone: 'UTC' })
  })
  it('names the zone as a calendar does, standard or daylight by the date (CLDR names through Intl)', () => {
    expect(zoneLongName('America/Los_Angeles', Date.parse(INSTANT))).toBe('Pacific Standard Time')
    expect(zoneLongName('America/Los_Angeles', Date.parse('2026-07-01T17:00:00Z'))).toBe('Pacific Daylight Time')
  })
})

