import fc from 'fast-check'
import ICAL from 'ical.js'
import { describe, expect, it } from 'vitest'
import {
  addDays,
  buildMonthlyNthWeekdayRule,
  buildWeeklyRule,
  describeRule,
  eachLocalDate,
  isoWeekdayOf,
  localDateAt,
  localToUtc,
  occurrenceDates,
  occurrenceDatesViaRRule,
  offsetMinutesAt,
  validateRule,
} from '../../../../shared/domain/recurrence'

const NEW_YORK = 'America/New_York'
const LOS_ANGELES = 'America/Los_Angeles'
const DENVER = 'America/Denver'
const PHOENIX = 'America/Phoenix'

/** 09:00 in New York as UTC: EDT (−04:00) → 13:00Z, EST (−05:00) → 14:00Z. */
const edt = (date: string): string => `${date}T13:00:00.000Z`
const est = (date: string): string => `${date}T14:00:00.000Z`

/** Runs a rule from DTSTART with no window limit and returns the 09:00 New York instants. */
function rfcInstants(rrule: string, dtstart: string, untilDate: string | null = null): string[] {
  return occurrenceDates(rrule, dtstart, untilDate, dtstart, '2002-12-31').map((date) => localToUtc(date, '09:00', NEW_YORK))
}

describe('RFC 5545 §3.8.5.3 examples (DTSTART;TZID=America/New_York 09:00), from check-values.md', () => {
  it('weekly for 10 occurrences: EDT, then EST from Oct 28', () => {
    // RFC 5545 §3.8.5.3 "Weekly for 10 occurrences"
    expect(rfcInstants('FREQ=WEEKLY;COUNT=10', '1997-09-02')).toEqual([
      edt('1997-09-02'), edt('1997-09-09'), edt('1997-09-16'), edt('1997-09-23'), edt('1997-09-30'),
      edt('1997-10-07'), edt('1997-10-14'), edt('1997-10-21'), est('1997-10-28'), est('1997-11-04'),
    ])
  })

  it('weekly on Tuesday and Thursday for five weeks', () => {
    // RFC 5545 §3.8.5.3 "Weekly on Tuesday and Thursday for five weeks" (COUNT form)
    expect(rfcInstants('FREQ=WEEKLY;COUNT=10;WKST=SU;BYDAY=TU,TH', '1997-09-02')).toEqual([
      edt('1997-09-02'), edt('1997-09-04'), edt('1997-09-09'), edt('1997-09-11'), edt('1997-09-16'),
      edt('1997-09-18'), edt('1997-09-23'), edt('1997-09-25'), edt('1997-09-30'), edt('1997-10-02'),
    ])
  })

  it('every other week on Tuesday and Thursday, for 8 occurrences', () => {
    // RFC 5545 §3.8.5.3 "Every other week on Tuesday and Thursday, for 8 occurrences"
    expect(rfcInstants('FREQ=WEEKLY;INTERVAL=2;COUNT=8;WKST=SU;BYDAY=TU,TH', '1997-09-02')).toEqual([
      edt('1997-09-02'), edt('1997-09-04'), edt('1997-09-16'), edt('1997-09-18'),
      edt('1997-09-30'), edt('1997-10-02'), edt('1997-10-14'), edt('1997-10-16'),
    ])
  })

  it('every other week on Monday, Wednesday and Friday until December 24, 1997', () => {
    // RFC 5545 §3.8.5.3: UNTIL=19971224T000000Z. Cuspline keeps the end outside the rule as an
    // inclusive local date, so the UTC UNTIL is turned into the New York date it falls on.
    const untilUtcMs = Date.UTC(1997, 11, 24, 0, 0, 0)
    const untilDate = localDateAt(untilUtcMs, NEW_YORK)
    expect(untilDate).toBe('1997-12-23') // 19:00 EST on 23 December
    const instants = rfcInstants('FREQ=WEEKLY;INTERVAL=2;WKST=SU;BYDAY=MO,WE,FR', '1997-09-01', untilDate)
    expect(instants).toEqual([
      edt('1997-09-01'), edt('1997-09-03'), edt('1997-09-05'), edt('1997-09-15'), edt('1997-09-17'),
      edt('1997-09-19'), edt('1997-09-29'), edt('1997-10-01'), edt('1997-10-03'), edt('1997-10-13'),
      edt('1997-10-15'), edt('1997-10-17'), est('1997-10-27'), est('1997-10-29'), est('1997-10-31'),
      est('1997-11-10'), est('1997-11-12'), est('1997-11-14'), est('1997-11-24'), est('1997-11-26'),
      est('1997-11-28'), est('1997-12-08'), est('1997-12-10'), est('1997-12-12'), est('1997-12-22'),
    ])
    expect(Date.parse(instants[instants.length - 1]!)).toBeLessThanOrEqual(untilUtcMs)
  })

  it('monthly on the first Friday for 10 occurrences', () => {
    // RFC 5545 §3.8.5.3 "Monthly on the first Friday for 10 occurrences"
    expect(rfcInstants('FREQ=MONTHLY;COUNT=10;BYDAY=1FR', '1997-09-05')).toEqual([
      edt('1997-09-05'), edt('1997-10-03'), est('1997-11-07'), est('1997-12-05'), est('1998-01-02'),
      est('1998-02-06'), est('1998-03-06'), est('1998-04-03'), edt('1998-05-01'), edt('1998-06-05'),
    ])
  })

  it('monthly on the second-to-last Monday of the month for 6 months', () => {
    // RFC 5545 §3.8.5.3 "Monthly on the second-to-last Monday of the month for 6 months"
    expect(rfcInstants('FREQ=MONTHLY;COUNT=6;BYDAY=-2MO', '1997-09-22')).toEqual([
      edt('1997-09-22'), edt('1997-10-20'), est('1997-11-17'), est('1997-12-22'), est('1998-01-19'), est('1998-02-16'),
    ])
  })

  it('the third instance into the month of one of Tuesday, Wednesday or Thursday, for the next 3 months', () => {
    // RFC 5545 §3.8.5.3 (BYSETPOS=3)
    expect(rfcInstants('FREQ=MONTHLY;COUNT=3;BYDAY=TU,WE,TH;BYSETPOS=3', '1997-09-04')).toEqual([
      edt('1997-09-04'), edt('1997-10-07'), est('1997-11-06'),
    ])
  })

  it('monthly on the first and last day of the month for 10 occurrences', () => {
    // RFC 5545 §3.8.5.3 "Monthly on the first and last day of the month for 10 occurrences"
    expect(rfcInstants('FREQ=MONTHLY;COUNT=10;BYMONTHDAY=1,-1', '1997-09-30')).toEqual([
      edt('1997-09-30'), edt('1997-10-01'), est('1997-10-31'), est('1997-11-01'), est('1997-11-30'),
      est('1997-12-01'), est('1997-12-31'), est('1998-01-01'), est('1998-01-31'), est('1998-02-01'),
    ])
  })

  it('yearly in June and July for 10 occurrences', () => {
    // RFC 5545 §3.8.5.3 "Yearly in June and July for 10 occurrences" (all in EDT)
    expect(rfcInstants('FREQ=YEARLY;COUNT=10;BYMONTH=6,7', '1997-06-10')).toEqual(
      ['1997', '1998', '1999', '2000', '2001'].flatMap((year) => [edt(`${year}-06-10`), edt(`${year}-07-10`)]),
    )
  })
})

// More RFC 5545 §3.8.5.3 examples, written down FROM MEMORY of the RFC (not copied from
// check-values.md). Each is also checked against ical.js, an independent implementation.
const FROM_MEMORY: Array<{ name: string; dtstart: string; rrule: string; dates: string[] }> = [
  {
    name: 'Daily for 10 occurrences',
    dtstart: '1997-09-02',
    rrule: 'FREQ=DAILY;COUNT=10',
    dates: ['1997-09-02', '1997-09-03', '1997-09-04', '1997-09-05', '1997-09-06', '1997-09-07', '1997-09-08', '1997-09-09', '1997-09-10', '1997-09-11'],
  },
  {
    name: 'Every 10 days, 5 occurrences',
    dtstart: '1997-09-02',
    rrule: 'FREQ=DAILY;INTERVAL=10;COUNT=5',
    dates: ['1997-09-02', '1997-09-12', '1997-09-22', '1997-10-02', '1997-10-12'],
  },
  {
    name: 'Every other month on the first and last Sunday of the month for 10 occurrences',
    dtstart: '1997-09-07',
    rrule: 'FREQ=MONTHLY;INTERVAL=2;COUNT=10;BYDAY=1SU,-1SU',
    dates: ['1997-09-07', '1997-09-28', '1997-11-02', '1997-11-30', '1998-01-04', '1998-01-25', '1998-03-01', '1998-03-29', '1998-05-03', '1998-05-31'],
  },
  {
    name: 'Monthly on the third-to-the-last day of the month (first 6)',
    dtstart: '1997-09-28',
    rrule: 'FREQ=MONTHLY;COUNT=6;BYMONTHDAY=-3',
    dates: ['1997-09-28', '1997-10-29', '1997-11-28', '1997-12-29', '1998-01-29', '1998-02-26'],
  },
  {
    name: 'Every Friday the 13th (the RFC excludes DTSTART with EXDATE; here it simply does not match)',
    dtstart: '1997-09-02',
    rrule: 'FREQ=MONTHLY;COUNT=5;BYDAY=FR;BYMONTHDAY=13',
    dates: ['1998-02-13', '1998-03-13', '1998-11-13', '1999-08-13', '2000-10-13'],
  },
  {
    name: 'The first Saturday that follows the first Sunday of the month, 10 occurrences',
    dtstart: '1997-09-13',
    rrule: 'FREQ=MONTHLY;COUNT=10;BYDAY=SA;BYMONTHDAY=7,8,9,10,11,12,13',
    dates: ['1997-09-13', '1997-10-11', '1997-11-08', '1997-12-13', '1998-01-10', '1998-02-07', '1998-03-07', '1998-04-11', '1998-05-09', '1998-06-13'],
  },
  {
    name: 'WKST makes a difference: every other week on Tuesday and Sunday, WKST=MO',
    dtstart: '1997-08-05',
    rrule: 'FREQ=WEEKLY;INTERVAL=2;COUNT=4;BYDAY=TU,SU;WKST=MO',
    dates: ['1997-08-05', '1997-08-10', '1997-08-19', '1997-08-24'],
  },
  {
    name: 'WKST makes a difference: the same rule with WKST=SU',
    dtstart: '1997-08-05',
    rrule: 'FREQ=WEEKLY;INTERVAL=2;COUNT=4;BYDAY=TU,SU;WKST=SU',
    dates: ['1997-08-05', '1997-08-17', '1997-08-19', '1997-08-31'],
  },
  {
    name: 'The last work day of the month (first 7)',
    dtstart: '1997-09-29',
    rrule: 'FREQ=MONTHLY;COUNT=7;BYDAY=MO,TU,WE,TH,FR;BYSETPOS=-1',
    dates: ['1997-09-30', '1997-10-31', '1997-11-28', '1997-12-31', '1998-01-30', '1998-02-27', '1998-03-31'],
  },
]

function icalDates(rrule: string, dtstart: string, limit: number): string[] {
  const iterator = ICAL.Recur.fromString(rrule).iterator(ICAL.Time.fromDateTimeString(`${dtstart}T09:00:00`))
  const dates: string[] = []
  for (let next = iterator.next(); next && dates.length < limit; next = iterator.next()) dates.push(next.toString().slice(0, 10))
  return dates
}

describe('further RFC 5545 §3.8.5.3 examples (from memory; cross-checked with ical.js)', () => {
  for (const example of FROM_MEMORY) {
    it(example.name, () => {
      const dates = occurrenceDates(example.rrule, example.dtstart, null, example.dtstart, '2002-12-31')
      expect(dates).toEqual(example.dates) // RFC 5545 §3.8.5.3, from memory
      expect(dates).toEqual(icalDates(example.rrule, example.dtstart, 50)) // ical.js 2.2.1
    })
  }

  it('every other week on Monday, Wednesday and Friday: the same dates in any window', () => {
    // RFC 5545 §3.8.5.3 row above, asked for a window in the middle: the phase must not shift.
    expect(occurrenceDates('FREQ=WEEKLY;INTERVAL=2;WKST=SU;BYDAY=MO,WE,FR', '1997-09-01', '1997-12-23', '1997-10-20', '1997-11-16')).toEqual([
      '1997-10-27', '1997-10-29', '1997-10-31', '1997-11-10', '1997-11-12', '1997-11-14',
    ])
  })
})

describe('occurrenceDates window and bounds', () => {
  it('keeps local dates steady across the 2026 DST changes (computed in wall time)', () => {
    // IANA tz database; 15 U.S.C. §260a: DST 8 March and 1 November 2026. The dates must not move.
    expect(occurrenceDates('FREQ=WEEKLY;BYDAY=SU', '2026-03-01', null, '2026-03-01', '2026-03-15')).toEqual([
      '2026-03-01', '2026-03-08', '2026-03-15',
    ])
    expect(occurrenceDates('FREQ=DAILY', '2026-10-31', null, '2026-10-31', '2026-11-02')).toEqual([
      '2026-10-31', '2026-11-01', '2026-11-02',
    ])
  })

  it('honours startDate as valid-from and untilDate as inclusive', () => {
    expect(occurrenceDates('FREQ=WEEKLY;BYDAY=MO', '2026-01-05', '2026-01-26', '2025-12-01', '2026-03-01')).toEqual([
      '2026-01-05', '2026-01-12', '2026-01-19', '2026-01-26',
    ])
  })

  it('does not count a start date that does not match the rule', () => {
    expect(occurrenceDates('FREQ=WEEKLY;BYDAY=MO', '2026-01-07', null, '2026-01-01', '2026-01-20')).toEqual(['2026-01-12', '2026-01-19'])
  })

  it('counts COUNT from the start date, not from the window', () => {
    expect(occurrenceDates('FREQ=WEEKLY;COUNT=3', '2026-01-05', null, '2026-01-15', '2026-03-01')).toEqual(['2026-01-19'])
  })

  it('returns nothing for an empty window and throws on an invalid rule', () => {
    expect(occurrenceDates('FREQ=DAILY', '2026-01-05', null, '2026-01-10', '2026-01-09')).toEqual([])
    expect(() => occurrenceDates('FREQ=HOURLY', '2026-01-05', null, '2026-01-05', '2026-01-09')).toThrow(RangeError)
  })

  it('the fast path for simple daily/weekly rules agrees with rrule on random rules and windows', () => {
    const codes = ['MO', 'TU', 'WE', 'TH', 'FR', 'SA', 'SU'] as const
    const arbRule = fc
      .record({
        freq: fc.constantFrom('DAILY', 'WEEKLY'),
        interval: fc.integer({ min: 1, max: 4 }),
        days: fc.subarray([...codes]),
        wkst: fc.option(fc.constantFrom(...codes), { nil: undefined }),
      })
      .map(({ freq, interval, days, wkst }) =>
        [`FREQ=${freq}`, interval > 1 ? `INTERVAL=${interval}` : '', days.length ? `BYDAY=${days.join(',')}` : '', wkst ? `WKST=${wkst}` : '']
          .filter(Boolean)
          .join(';'),
      )
    const arbOffset = fc.integer({ min: 0, max: 800 })
    fc.assert(
      fc.property(arbRule, arbOffset, arbOffset, fc.integer({ min: 0, max: 120 }), fc.option(arbOffset, { nil: null }), (rule, startOffset, fromOffset, length, untilOffset) => {
        const start = addDays('2024-01-01', startOffset)
        const from = addDays('2024-01-01', fromOffset)
        const to = addDays(from, length)
        const until = untilOffset === null ? null : addDays('2024-01-01', untilOffset)
        expect(occurrenceDates(rule, start, until, from, to)).toEqual(occurrenceDatesViaRRule(rule, start, until, from, to))
      }),
      { numRuns: 300 },
    )
  })
})

describe('localToUtc across 2026 DST (IANA tz database; 15 U.S.C. §260a)', () => {
  it('converts ordinary times with the offset of the day', () => {
    expect(localToUtc('2026-03-06', '08:00', LOS_ANGELES)).toBe('2026-03-06T16:00:00.000Z') // PST −08:00
    expect(localToUtc('2026-03-09', '08:00', LOS_ANGELES)).toBe('2026-03-09T15:00:00.000Z') // PDT −07:00
    expect(localToUtc('2026-11-02', '08:00', LOS_ANGELES)).toBe('2026-11-02T16:00:00.000Z') // PST again
    expect(localToUtc('2026-03-06', '08:00', DENVER)).toBe('2026-03-06T15:00:00.000Z') // MST −07:00
    expect(localToUtc('2026-03-09', '08:00', DENVER)).toBe('2026-03-09T14:00:00.000Z') // MDT −06:00
    expect(localToUtc('2026-07-01', '08:00', PHOENIX)).toBe('2026-07-01T15:00:00.000Z') // MST all year
  })

  it('moves a nonexistent 02:30 on 8 March forward by the gap (RFC 5545 §3.3.5: offset before the gap)', () => {
    expect(localToUtc('2026-03-08', '01:59', LOS_ANGELES)).toBe('2026-03-08T09:59:00.000Z') // 01:59 PST
    expect(localToUtc('2026-03-08', '02:00', LOS_ANGELES)).toBe('2026-03-08T10:00:00.000Z') // = 03:00 PDT
    expect(localToUtc('2026-03-08', '02:30', LOS_ANGELES)).toBe('2026-03-08T10:30:00.000Z') // = 03:30 PDT
    expect(localToUtc('2026-03-08', '03:00', LOS_ANGELES)).toBe('2026-03-08T10:00:00.000Z') // 03:00 PDT
    expect(localToUtc('2026-03-08', '02:30', DENVER)).toBe('2026-03-08T09:30:00.000Z') // = 03:30 MDT
    expect(localToUtc('2026-03-08', '02:30', PHOENIX)).toBe('2026-03-08T09:30:00.000Z') // no DST: exists
  })

  it('reads an ambiguous 01:30 on 1 November as the first, daylight one (RFC 5545 §3.3.5)', () => {
    expect(localToUtc('2026-11-01', '01:30', LOS_ANGELES)).toBe('2026-11-01T08:30:00.000Z') // 01:30 PDT, not 09:30Z PST
    expect(localToUtc('2026-11-01', '01:30', DENVER)).toBe('2026-11-01T07:30:00.000Z') // 01:30 MDT
    expect(localToUtc('2026-11-01', '02:00', LOS_ANGELES)).toBe('2026-11-01T10:00:00.000Z') // 02:00 PST, after the repeat
    expect(localToUtc('2026-11-01', '01:30', PHOENIX)).toBe('2026-11-01T08:30:00.000Z') // no DST: once
  })

  it('matches the RFC 5545 §3.3.5 worked examples for New York, 2007 (from memory)', () => {
    expect(localToUtc('2007-11-04', '01:30', NEW_YORK)).toBe('2007-11-04T05:30:00.000Z') // 01:30 EDT (−04:00)
    expect(localToUtc('2007-03-11', '02:30', NEW_YORK)).toBe('2007-03-11T07:30:00.000Z') // 03:30 EDT
  })

  it('knows the offsets and local dates either side of the changes', () => {
    expect(offsetMinutesAt(LOS_ANGELES, Date.UTC(2026, 2, 8, 9, 59))).toBe(-480)
    expect(offsetMinutesAt(LOS_ANGELES, Date.UTC(2026, 2, 8, 10, 0))).toBe(-420) // 02:00 PST → 03:00 PDT
    expect(offsetMinutesAt(LOS_ANGELES, Date.UTC(2026, 10, 1, 8, 59))).toBe(-420)
    expect(offsetMinutesAt(LOS_ANGELES, Date.UTC(2026, 10, 1, 9, 0))).toBe(-480) // 02:00 PDT → 01:00 PST
    expect(offsetMinutesAt(PHOENIX, Date.UTC(2026, 6, 1))).toBe(-420)
    expect(localDateAt(Date.UTC(2026, 2, 9, 6, 59), LOS_ANGELES)).toBe('2026-03-08')
    expect(localDateAt(Date.UTC(2026, 2, 9, 7, 0), LOS_ANGELES)).toBe('2026-03-09')
  })

  it('rejects unknown zones and malformed local values', () => {
    expect(() => localToUtc('2026-03-08', '09:00', 'Mars/Olympus_Mons')).toThrow(RangeError)
    expect(() => localToUtc('2026-02-30', '09:00', LOS_ANGELES)).toThrow(RangeError)
    expect(() => localToUtc('2026-03-08', '9:00', LOS_ANGELES)).toThrow(RangeError)
    expect(() => localToUtc('2026-03-08', '24:30', LOS_ANGELES)).toThrow(RangeError)
  })
})

describe('local calendar helpers', () => {
  it('steps dates and weekdays on the calendar, not by 24-hour instants', () => {
    expect(addDays('2026-03-07', 2)).toBe('2026-03-09')
    expect(addDays('2026-03-01', -1)).toBe('2026-02-28')
    expect(isoWeekdayOf('2026-03-09')).toBe(1) // a Monday
    expect(isoWeekdayOf('2026-03-08')).toBe(7) // a Sunday
    expect(eachLocalDate('2026-10-31', '2026-11-02')).toEqual(['2026-10-31', '2026-11-01', '2026-11-02'])
  })
})

describe('validateRule', () => {
  it('accepts the rules the UI builds and the RFC examples', () => {
    expect(validateRule('FREQ=WEEKLY;BYDAY=MO,WE')).toBeNull()
    expect(validateRule('RRULE:FREQ=MONTHLY;BYDAY=1MO')).toBeNull()
    expect(validateRule('FREQ=MONTHLY;COUNT=3;BYDAY=TU,WE,TH;BYSETPOS=3')).toBeNull()
  })

  it.each([
    ['DTSTART:20260105T090000\nRRULE:FREQ=WEEKLY', /DTSTART/],
    ['FREQ=WEEKLY;DTSTART=20260105', /DTSTART/],
    ['FREQ=WEEKLY;COUNT=5;UNTIL=20260301T000000Z', /COUNT or by UNTIL/], // RFC 5545 §3.3.10
    ['FREQ=WEEKLY;UNTIL=20260301', /until date/],
    ['FREQ=SECONDLY', /more often than daily/],
    ['FREQ=MINUTELY;INTERVAL=15', /more often than daily/],
    ['FREQ=HOURLY', /more often than daily/],
    ['FREQ=FORTNIGHTLY', /not a known frequency/],
    ['BYDAY=MO', /needs a FREQ/],
    ['', /empty/],
    ['FREQ=WEEKLY;FREQ=DAILY', /each named once/],
    ['FREQ=DAILY;BYHOUR=9', /BYHOUR/],
    ['FREQ=WEEKLY;INTERVAL=0', /INTERVAL/],
    ['FREQ=WEEKLY;BYDAY=1MO', /monthly or yearly/], // RFC 5545 §3.3.10
    ['FREQ=WEEKLY;BYDAY=MON', /not a weekday/],
    ['FREQ=WEEKLY;X-NAME=1', /not a supported rule part/],
  ])('rejects %j', (rule, reason) => {
    expect(validateRule(rule)).toMatch(reason)
  })
})

describe('rule builders and descriptions', () => {
  it('builds weekly rules from ISO weekdays, sorted and without repeats', () => {
    expect(buildWeeklyRule({ weekdays: [3, 1, 3] })).toBe('FREQ=WEEKLY;BYDAY=MO,WE')
    expect(buildWeeklyRule({ weekdays: [5], interval: 2 })).toBe('FREQ=WEEKLY;INTERVAL=2;BYDAY=FR')
    expect(() => buildWeeklyRule({ weekdays: [] })).toThrow(RangeError)
    expect(() => buildWeeklyRule({ weekdays: [1], interval: 0 })).toThrow(RangeError)
  })

  it('builds monthly nth-weekday rules', () => {
    expect(buildMonthlyNthWeekdayRule({ nth: 1, weekday: 1 })).toBe('FREQ=MONTHLY;BYDAY=1MO')
    expect(buildMonthlyNthWeekdayRule({ nth: -1, weekday: 5, interval: 3 })).toBe('FREQ=MONTHLY;INTERVAL=3;BYDAY=-1FR')
    expect(() => buildMonthlyNthWeekdayRule({ nth: 0, weekday: 1 })).toThrow(RangeError)
    expect(validateRule(buildMonthlyNthWeekdayRule({ nth: 4, weekday: 7 }))).toBeNull()
  })

  it('built rules produce the expected dates', () => {
    // 2026-01: Mondays 5, 12, 19, 26 → first Monday 5 Jan; February's is the 2nd.
    expect(occurrenceDates(buildMonthlyNthWeekdayRule({ nth: 1, weekday: 1 }), '2026-01-01', null, '2026-01-01', '2026-02-28')).toEqual([
      '2026-01-05', '2026-02-02',
    ])
  })

  it.each([
    ['FREQ=WEEKLY;BYDAY=MO,WE', 'every Monday and Wednesday'],
    ['FREQ=WEEKLY;INTERVAL=2;BYDAY=FR', 'every other Friday'],
    ['FREQ=WEEKLY;INTERVAL=3;BYDAY=TU,TH', 'every 3 weeks on Tuesday and Thursday'],
    ['FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', 'every weekday'],
    ['FREQ=WEEKLY;BYDAY=MO,WE,FR', 'every Monday, Wednesday and Friday'],
    ['FREQ=WEEKLY', 'every week'],
    ['FREQ=DAILY', 'every day'],
    ['FREQ=DAILY;INTERVAL=2', 'every other day'],
    ['FREQ=MONTHLY;BYDAY=1MO', 'the first Monday of each month'],
    ['FREQ=MONTHLY;BYDAY=-1FR', 'the last Friday of each month'],
    ['FREQ=MONTHLY;INTERVAL=2;BYDAY=1SU,-1SU', 'the first and last Sunday of every other month'],
    ['FREQ=MONTHLY;COUNT=6;BYDAY=-2MO', 'the second to last Monday of each month, 6 times'],
    ['FREQ=MONTHLY;BYMONTHDAY=15', 'the 15th of each month'],
    ['FREQ=MONTHLY;BYMONTHDAY=1,-1', 'the 1st and last day of each month'],
    ['FREQ=MONTHLY;BYDAY=MO,TU,WE,TH,FR;BYSETPOS=-1', 'the last weekday of each month'],
    ['FREQ=MONTHLY;BYDAY=TU,WE,TH;BYSETPOS=3', 'the third Tuesday, Wednesday or Thursday of each month'],
    ['FREQ=YEARLY;COUNT=10;BYMONTH=6,7', 'every June and July, 10 times'],
    ['FREQ=HOURLY', 'an unreadable rule'],
  ])('describes %s as "%s"', (rule, text) => {
    expect(describeRule(rule)).toBe(text)
  })
})
