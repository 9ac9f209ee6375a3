// Balance figures from open time, shift time and visit segments. Invented times; the rules (what
// holds a chair, what occupies a provider) are the glossary's, the thresholds common practice.
import { describe, expect, it } from 'vitest'
import { bandOf, siteBalance, type BalanceSegment } from '../../../../shared/domain/balance'

const H = 3_600_000
const M = 60_000
const DAY = Date.UTC(2027, 0, 11) // any day: the engine works on plain instants

function at(hours: number): number {
  return DAY + hours * H
}

function segment(kind: BalanceSegment['kind'], fromHours: number, toHours: number, operatoryId = 1, providerId = 7): BalanceSegment {
  return { kind, operatoryId, providerId, startMs: at(fromHours), endMs: at(toHours) }
}

const morning = [{ startMs: at(8), endMs: at(12) }] // four hours open / on shift

describe('siteBalance', () => {
  it('counts every segment as chair time but only hands-on work as provider time', () => {
    const result = siteBalance({
      fromMs: at(0), toMs: at(24),
      operatories: [{ operatoryId: 1, intervals: morning }],
      providers: [{ providerId: 7, intervals: morning }],
      segments: [segment('numbing', 9, 9.25), segment('hands_on', 9.25, 10), segment('reset', 10, 10.25)],
    })
    expect(result.operatories[0]).toMatchObject({ operatoryId: 1, availableMinutes: 240, usedMinutes: 75, share: 75 / 240, band: 'quiet' })
    expect(result.providers[0]).toMatchObject({ providerId: 7, availableMinutes: 240, usedMinutes: 45, share: 45 / 240 })
  })

  it('counts overlapping time once, and nothing outside open time or the range', () => {
    const result = siteBalance({
      fromMs: at(9), toMs: at(24),
      operatories: [{ operatoryId: 1, intervals: morning }],
      providers: [],
      // 07:00–09:30 is before the range start (09:00) and partly before opening; 11:30–13:00 runs past closing.
      segments: [segment('hands_on', 7, 9.5), segment('assist', 9.25, 9.5), segment('hands_on', 11.5, 13)],
    })
    expect(result.operatories[0]).toMatchObject({ availableMinutes: 180, usedMinutes: 60 })
  })

  it('never passes 100 %, and has no share for a chair that was never open', () => {
    const result = siteBalance({
      fromMs: at(0), toMs: at(24),
      operatories: [{ operatoryId: 1, intervals: morning }, { operatoryId: 2, intervals: [] }],
      providers: [],
      segments: [segment('hands_on', 6, 14), segment('hands_on', 8, 12, 2)],
    })
    expect(result.operatories[0]).toMatchObject({ share: 1, band: 'tight' })
    expect(result.operatories[1]).toMatchObject({ availableMinutes: 0, usedMinutes: 0, share: null, band: null })
    expect(result.chairs).toMatchObject({ availableMinutes: 240, usedMinutes: 240, share: 1 })
  })

  it('adds the site\'s chairs together', () => {
    const result = siteBalance({
      fromMs: at(0), toMs: at(24),
      operatories: [{ operatoryId: 1, intervals: morning }, { operatoryId: 2, intervals: morning }],
      providers: [],
      segments: [segment('hands_on', 8, 12, 1), segment('hands_on', 8, 9, 2)],
    })
    expect(result.chairs).toMatchObject({ availableMinutes: 480, usedMinutes: 300, band: 'steady' })
    expect(result.chairs.share).toBeCloseTo(300 / 480)
  })

  it('rounds to whole minutes', () => {
    const result = siteBalance({
      fromMs: at(0), toMs: at(24),
      operatories: [{ operatoryId: 1, intervals: [{ startMs: at(8), endMs: at(8) + 90 * M + 20_000 }] }],
      providers: [],
      segments: [],
    })
    expect(result.operatories[0]!.availableMinutes).toBe(90)
  })
})

describe('siteBalance day by day', () => {
  it('splits the chairs\' figures into the given days, and they add up to the whole', () => {
    const nextDay = (hours: number) => at(24 + hours)
    const result = siteBalance({
      fromMs: at(0), toMs: at(48),
      operatories: [{ operatoryId: 1, intervals: [...morning, { startMs: nextDay(8), endMs: nextDay(12) }] }],
      providers: [{ providerId: 7, intervals: [...morning, { startMs: nextDay(8), endMs: nextDay(12) }] }],
      segments: [segment('hands_on', 9, 12), { kind: 'hands_on', operatoryId: 1, providerId: 7, startMs: nextDay(8), endMs: nextDay(9) }],
      days: [{ date: '2027-01-11', startMs: at(0), endMs: at(24) }, { date: '2027-01-12', startMs: at(24), endMs: at(48) }],
    })
    expect(result.days).toEqual([
      { date: '2027-01-11', availableMinutes: 240, usedMinutes: 180, share: 0.75, band: 'steady', nobodyOnShift: false },
      { date: '2027-01-12', availableMinutes: 240, usedMinutes: 60, share: 0.25, band: 'quiet', nobodyOnShift: false },
    ])
    expect(result.chairs).toMatchObject({ availableMinutes: 480, usedMinutes: 240 })
  })

  it('gives a closed day no share', () => {
    const result = siteBalance({
      fromMs: at(0), toMs: at(48),
      operatories: [{ operatoryId: 1, intervals: morning }],
      providers: [],
      segments: [],
      days: [{ date: '2027-01-12', startMs: at(24), endMs: at(48) }],
    })
    expect(result.days[0]).toMatchObject({ availableMinutes: 0, share: null, band: null })
  })
})

describe('days with nobody on shift (issue 14)', () => {
  it('leaves a day with open chairs but nobody on shift out of the open hours, so it does not read as quiet', () => {
    const nextDay = (hours: number) => at(24 + hours)
    const result = siteBalance({
      fromMs: at(0), toMs: at(48),
      operatories: [{ operatoryId: 1, intervals: [...morning, { startMs: nextDay(8), endMs: nextDay(12) }] }],
      // On shift on the first day only.
      providers: [{ providerId: 7, intervals: morning }],
      segments: [segment('hands_on', 9, 12)],
      days: [{ date: '2027-01-11', startMs: at(0), endMs: at(24) }, { date: '2027-01-12', startMs: at(24), endMs: at(48) }],
    })
    expect(result.days[0]).toMatchObject({ availableMinutes: 240, usedMinutes: 180, band: 'steady', nobodyOnShift: false })
    expect(result.days[1]).toMatchObject({ availableMinutes: 0, share: null, band: null, nobodyOnShift: true })
    // The chair's figures keep only the staffed day: 3 of 4 hours, not 3 of 8 (which would read quiet).
    expect(result.operatories[0]).toMatchObject({ availableMinutes: 240, usedMinutes: 180, band: 'steady' })
    expect(result.chairs).toMatchObject({ availableMinutes: 240, usedMinutes: 180 })
  })

  it('counts open hours as before when no days are given', () => {
    const result = siteBalance({ fromMs: at(0), toMs: at(24), operatories: [{ operatoryId: 1, intervals: morning }], providers: [], segments: [] })
    expect(result.operatories[0]).toMatchObject({ availableMinutes: 240 })
  })
})

describe('bandOf', () => {
  it('puts the thresholds themselves in the upper band', () => {
    expect(bandOf(0.49)).toBe('quiet')
    expect(bandOf(0.5)).toBe('steady')
    expect(bandOf(0.89)).toBe('steady')
    expect(bandOf(0.9)).toBe('tight')
    expect(bandOf(null)).toBeNull()
    expect(bandOf(0.6, { quietBelow: 0.7, tightFrom: 0.95 })).toBe('quiet')
  })
})
