// Pure helpers behind My day and the week views: a visit placed on its site-local date, numbing countdowns.
import { describe, expect, it } from 'vitest'
import type { SegmentDto } from '../../../../shared/types/visits'
import { countdownText, msUntilReady, placeOnWeek } from '../../../../shared/utils/visit-times'

// Fixed dates on purpose: these helpers are pure and take "now" and "today" as arguments.
const segment = (kind: SegmentDto['kind'], startUtc: string, endUtc: string): SegmentDto => ({ kind, label: kind, operatoryId: 1, providerId: 1, startUtc, endUtc })
const SEGMENTS = [
  segment('assist', '2027-03-15T17:00:00Z', '2027-03-15T17:05:00Z'),
  segment('hands_on', '2027-03-15T17:05:00Z', '2027-03-15T17:10:00Z'),
  segment('numbing', '2027-03-15T17:10:00Z', '2027-03-15T17:20:00Z'),
  segment('hands_on', '2027-03-15T17:20:00Z', '2027-03-15T17:50:00Z'),
]

describe('week placement', () => {
  it('places a visit on its site-local date, never the browser’s', () => {
    const visit = { startUtc: '2027-03-16T05:30:00Z', endUtc: '2027-03-16T06:30:00Z' } as Parameters<typeof placeOnWeek>[0]
    // 05:30 UTC on the 16th is 22:30 on the 15th in Phoenix (UTC−7 all year).
    expect(placeOnWeek(visit, 'America/Phoenix')).toMatchObject({ date: '2027-03-15', startMinutes: 22 * 60 + 30, endMinutes: 23 * 60 + 30 })
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
