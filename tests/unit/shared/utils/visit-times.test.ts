// Pure helpers behind My day and the week views: a visit placed on its site-local date, segment bands, countdown text (the numbing clock: tests/unit/shared/domain/numbing-clock.test.ts).
import { describe, expect, it } from 'vitest'
import { countdownText, placeOnWeek, segmentBands } from '../../../../shared/utils/visit-times'
import type { SegmentDto } from '../../../../shared/types/visits'

// Fixed dates on purpose: these helpers are pure and take "now" and "today" as arguments.
describe('week placement', () => {
  it('places a visit on its site-local date, never the browser’s', () => {
    const visit = { startUtc: '2027-03-16T05:30:00Z', endUtc: '2027-03-16T06:30:00Z' } as Parameters<typeof placeOnWeek>[0]
    // 05:30 UTC on the 16th is 22:30 on the 15th in Phoenix (UTC−7 all year).
    expect(placeOnWeek(visit, 'America/Phoenix')).toMatchObject({ date: '2027-03-15', startMinutes: 22 * 60 + 30, endMinutes: 23 * 60 + 30 })
  })
})

describe('countdown text', () => {
  it('writes the time left as m:ss, rounding up to the next whole second', () => {
    expect(countdownText(7.5 * 60_000)).toBe('7:30')
    expect(countdownText(400)).toBe('0:01')
    expect(countdownText(0)).toBe('0:00')
    expect(countdownText(3_725_000)).toBe('1:02:05')
  })
})

describe('segment bands', () => {
  const segment = (kind: SegmentDto['kind'], label: string, start: string, end: string) =>
    ({ kind, label, startUtc: `2027-03-16T${start}:00Z`, endUtc: `2027-03-16T${end}:00Z` }) as SegmentDto
  it('draws each segment at its share of the visit, in time order, with its minutes and meaning in the title', () => {
    // A 60-minute visit: hands-on 20, numbing 10, hands-on 20, reset 10 (given out of order).
    const bands = segmentBands([
      segment('reset', 'Room reset', '09:50', '10:00'),
      segment('hands_on', 'Prepare', '09:00', '09:20'),
      segment('numbing', 'Onset wait', '09:20', '09:30'),
      segment('hands_on', 'Restore', '09:30', '09:50'),
    ], '2027-03-16T09:00:00Z', '2027-03-16T10:00:00Z')
    expect(bands.map((band) => [band.kind, Math.round(band.offsetPercent * 100) / 100, Math.round(band.sizePercent * 100) / 100])).toEqual([
      ['hands_on', 0, 33.33], ['numbing', 33.33, 16.67], ['hands_on', 50, 33.33], ['reset', 83.33, 16.67],
    ])
    expect(bands[1]!.title).toBe('Onset wait: 10 min (numbing wait, provider free)')
    expect(bands.reduce((sum, band) => sum + band.sizePercent, 0)).toBeCloseTo(100)
  })
  it('cuts a segment to the visit, so no band draws outside the card', () => {
    const [band] = segmentBands([segment('assist', 'Set-up', '08:50', '09:15')], '2027-03-16T09:00:00Z', '2027-03-16T10:00:00Z')
    expect(band).toMatchObject({ offsetPercent: 0, sizePercent: 25, title: 'Set-up: 15 min (assistant only)' })
    expect(segmentBands([segment('reset', 'Late', '10:30', '10:40')], '2027-03-16T09:00:00Z', '2027-03-16T10:00:00Z')[0]!.sizePercent).toBe(0)
  })
})

