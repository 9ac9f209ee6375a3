// Pure helpers behind My day and the week views: local day windows, numbing countdowns, lanes.
import { describe, expect, it } from 'vitest'
import type { SegmentDto } from '../../../shared/types/appointments'
import { anyZoneRange, countdownText, laneSpans, localDayRange, minutesIntoDay, msUntilReady, placeOnWeek, weekDays } from '../../../composables/useVisitTimes'

// Fixed dates on purpose: these helpers are pure and take "now" and "today" as arguments.
const segment = (kind: SegmentDto['kind'], startUtc: string, endUtc: string): SegmentDto => ({ kind, label: kind, operatoryId: 1, providerId: 1, startUtc, endUtc })
const SEGMENTS = [
  segment('assist', '2027-03-15T17:00:00Z', '2027-03-15T17:05:00Z'),
  segment('hands_on', '2027-03-15T17:05:00Z', '2027-03-15T17:10:00Z'),
  segment('numbing', '2027-03-15T17:10:00Z', '2027-03-15T17:20:00Z'),
  segment('hands_on', '2027-03-15T17:20:00Z', '2027-03-15T17:50:00Z'),
]

describe('local days', () => {
  it('turns a Los Angeles date into its UTC range, across the spring-forward night (23 hours)', () => {
    // 2027-03-14 is the second Sunday of March: US daylight saving starts (Energy Policy Act of 2005).
    expect(localDayRange('2027-03-14', 'America/Los_Angeles')).toEqual({ fromUtc: '2027-03-14T08:00:00.000Z', toUtc: '2027-03-15T07:00:00.000Z' })
    expect(minutesIntoDay('2027-03-15T17:00:00Z', 'America/Los_Angeles', '2027-03-15')).toBe(10 * 60)
  })

  it('asks wide enough to cover the same local dates in every zone', () => {
    expect(anyZoneRange('2027-03-15', '2027-03-21')).toEqual({ fromUtc: '2027-03-14T00:00:00.000Z', toUtc: '2027-03-23T00:00:00.000Z' })
  })

  it('places a visit on its site-local date, never the browser’s', () => {
    const visit = { startUtc: '2027-03-16T05:30:00Z', endUtc: '2027-03-16T06:30:00Z' } as Parameters<typeof placeOnWeek>[0]
    // 05:30 UTC on the 16th is 22:30 on the 15th in Phoenix (UTC−7 all year).
    expect(placeOnWeek(visit, 'America/Phoenix')).toMatchObject({ date: '2027-03-15', startMinutes: 22 * 60 + 30, endMinutes: 23 * 60 + 30 })
    expect(weekDays('2027-03-15', '2027-03-17').map((day) => [day.label, day.today])[2]).toEqual(['Wed 17 Mar', true])
  })
})

describe('numbing countdown', () => {
  it('counts down to the end of the numbing segment the visit is in', () => {
    const visit = { segments: SEGMENTS, state: 'arrived' as const }
    expect(msUntilReady(visit, Date.parse('2027-03-15T17:12:30Z'))).toBe(7.5 * 60_000)
    expect(msUntilReady(visit, Date.parse('2027-03-15T17:09:59Z'))).toBeNull()
    expect(msUntilReady(visit, Date.parse('2027-03-15T17:20:00Z'))).toBeNull()
    expect(msUntilReady({ ...visit, state: 'finished' }, Date.parse('2027-03-15T17:12:30Z'))).toBeNull()
  })

  it('writes the time left as m:ss, rounding up to the next whole second', () => {
    expect(countdownText(7.5 * 60_000)).toBe('7:30')
    expect(countdownText(400)).toBe('0:01')
    expect(countdownText(0)).toBe('0:00')
    expect(countdownText(3_725_000)).toBe('1:02:05')
  })
})

describe('lanes', () => {
  it('puts overlapping visits side by side and leaves lone ones full width', () => {
    const placed = laneSpans([
      { id: 'a', startMinutes: 600, endMinutes: 660 },
      { id: 'b', startMinutes: 630, endMinutes: 700 },
      { id: 'c', startMinutes: 720, endMinutes: 760 },
    ])
    expect(placed.map((entry) => [entry.item.id, entry.lane, entry.lanes])).toEqual([['a', 0, 2], ['b', 1, 2], ['c', 0, 1]])
  })
})
