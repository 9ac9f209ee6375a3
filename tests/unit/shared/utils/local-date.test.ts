// The one home for local dates and times: calendar arithmetic, zone offsets, local ↔ UTC,
// day ranges. Fixed dates on purpose: these helpers are pure and take "now" as an argument.
import { describe, expect, it } from 'vitest'
import {
  addDays,
  anyZoneRange,
  eachLocalDate,
  firstOffsetChange,
  isKnownZone,
  isoWeekdayOf,
  localDateAt,
  localDayRange,
  localMinutesAt,
  localTime,
  localToUtc,
  localToUtcOrNull,
  minutesIntoDay,
  minutesOfDay,
  mondayOf,
  offsetMinutesAt,
  todayIn,
  wallMsAt,
} from '../../../../shared/utils/local-date'

const NEW_YORK = 'America/New_York'
const LOS_ANGELES = 'America/Los_Angeles'
const DENVER = 'America/Denver'
const PHOENIX = 'America/Phoenix'

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
    expect(mondayOf('2026-03-08')).toBe('2026-03-02') // Sunday → the Monday before
    expect(mondayOf('2026-03-09')).toBe('2026-03-09')
  })

  it('reads times of day as minutes, with 24:00 as the end of the day', () => {
    expect(minutesOfDay('07:30')).toBe(450)
    expect(minutesOfDay('24:00')).toBe(1440)
    expect(() => minutesOfDay('24:30')).toThrow(RangeError)
  })
})

describe('local days and today', () => {
  it('turns a Los Angeles date into its UTC range, across the spring-forward night (23 hours)', () => {
    // 2027-03-14 is the second Sunday of March: US daylight saving starts (Energy Policy Act of 2005).
    expect(localDayRange('2027-03-14', LOS_ANGELES)).toEqual({ fromUtc: '2027-03-14T08:00:00.000Z', toUtc: '2027-03-15T07:00:00.000Z' })
    const fallBack = localDayRange('2026-11-01', LOS_ANGELES)
    expect((Date.parse(fallBack.toUtc) - Date.parse(fallBack.fromUtc)) / 3_600_000).toBe(25)
    expect(minutesIntoDay('2027-03-15T17:00:00Z', LOS_ANGELES, '2027-03-15')).toBe(10 * 60)
    expect(localTime('2027-03-15T17:00:00Z', LOS_ANGELES)).toBe('10:00')
  })

  it('asks wide enough to cover the same local dates in every zone', () => {
    expect(anyZoneRange('2027-03-15', '2027-03-21')).toEqual({ fromUtc: '2027-03-14T00:00:00.000Z', toUtc: '2027-03-23T00:00:00.000Z' })
  })

  it("reads today on the site's wall clock, not the machine's", () => {
    // 05:30 UTC on 16 March 2027 is still the 15th in Phoenix (UTC−7) and already the 16th in UTC.
    const now = Date.parse('2027-03-16T05:30:00Z')
    expect(todayIn(PHOENIX, now)).toBe('2027-03-15')
    expect(todayIn('UTC', now)).toBe('2027-03-16')
  })

  it('finds the instant an offset changes (2 a.m. PST → PDT on 8 March 2026)', () => {
    expect(firstOffsetChange(LOS_ANGELES, Date.UTC(2026, 2, 7), Date.UTC(2026, 2, 9))).toBe(Date.UTC(2026, 2, 8, 10, 0))
  })
})

describe('wall clock at an instant, and typed local times', () => {
  it('reads the wall clock of the zone, not UTC: 17:05 UTC is 09:05 in Los Angeles and 10:05 in Phoenix', () => {
    const instant = Date.UTC(2026, 11, 1, 17, 5, 30)
    expect(new Date(wallMsAt(instant, LOS_ANGELES)).toISOString()).toBe('2026-12-01T09:05:30.000Z')
    expect(localMinutesAt(instant, LOS_ANGELES)).toBe(9 * 60 + 5)
    expect(localMinutesAt(instant, PHOENIX)).toBe(10 * 60 + 5)
    // 07:30 UTC on 2 December is still 1 December, 23:30, in Los Angeles.
    expect(localMinutesAt(Date.UTC(2026, 11, 2, 7, 30), LOS_ANGELES)).toBe(23 * 60 + 30)
    expect(localDateAt(Date.UTC(2026, 11, 2, 7, 30), LOS_ANGELES)).toBe('2026-12-01')
  })
  it('turns a form\'s date and time into an instant, and a half-filled or impossible one into null', () => {
    expect(localToUtcOrNull('2026-03-09', '08:00', LOS_ANGELES)).toBe(localToUtc('2026-03-09', '08:00', LOS_ANGELES))
    // In the spring-forward gap it moves forward, as localToUtc does (RFC 5545 §3.3.5).
    expect(localToUtcOrNull('2026-03-08', '02:30', LOS_ANGELES)).toBe('2026-03-08T10:30:00.000Z')
    for (const [date, time] of [['', '08:00'], ['2026-03-09', ''], ['2026-02-30', '08:00'], ['2026-03-09', '25:00'], ['2026-03-09', '24:00'], ['9/3/2026', '08:00']]) {
      expect(localToUtcOrNull(date!, time!, LOS_ANGELES)).toBeNull()
    }
  })
  it('knows the zones of the IANA database and no others', () => {
    expect(isKnownZone(DENVER)).toBe(true)
    expect(isKnownZone('Etc/GMT+5')).toBe(true)
    expect(isKnownZone('Mars/Olympus_Mons')).toBe(false)
    expect(isKnownZone('')).toBe(false)
  })
})
