import fc from 'fast-check'
import ICAL from 'ical.js'
import { describe, expect, it } from 'vitest'
import { occurrenceDates, occurrenceDatesViaRRule } from '../../../../../shared/domain/recurrence/occurrences'
import { addDays, localDateAt, localToUtc } from '../../../../../shared/utils/local-date'

const NEW_YORK = 'America/New_York'

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
