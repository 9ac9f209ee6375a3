// Pure helpers behind My day and the week views: a visit placed on its site-local date, countdown text (the numbing clock: tests/unit/shared/domain/numbing-clock.test.ts).
import { describe, expect, it } from 'vitest'
import { countdownText, placeOnWeek } from '../../../../shared/utils/visit-times'

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
