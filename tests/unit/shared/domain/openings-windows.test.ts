import { describe, expect, it } from 'vitest'
import {
  chairStartWindows, EVERY_START, handsOnStretches, intersectWindows, intervalsTouching, providerStartWindows,
  startsFitting, windowsContain,
} from '../../../../shared/domain/openings-windows'
import type { OpeningsPlan } from '../../../../shared/types/openings'

const M = 60_000
const free = (a: number, b: number) => ({ startMs: a * M, endMs: b * M })
const win = (a: number, b: number) => ({ firstMs: a * M, lastMs: b * M })

describe('startsFitting and chairStartWindows', () => {
  it('a chair free from 0 to 60 takes a 40-minute visit starting from 0 to 20', () => {
    expect(chairStartWindows([free(0, 60)], 40 * M)).toEqual([win(0, 20)])
  })

  it('drops free intervals shorter than the need, and an exact fit has one start', () => {
    expect(chairStartWindows([free(0, 30), free(100, 140)], 40 * M)).toEqual([win(100, 100)])
  })

  it('a stretch that starts later in the visit moves the window earlier', () => {
    expect(startsFitting([free(60, 90)], 20 * M, 10 * M)).toEqual([win(40, 60)])
  })
})

describe('intersectWindows', () => {
  it('keeps only starts in both lists', () => {
    expect(intersectWindows([win(0, 10), win(20, 30)], [win(5, 25)])).toEqual([win(5, 10), win(20, 25)])
    expect(intersectWindows([win(0, 10)], [win(11, 20)])).toEqual([])
    expect(intersectWindows(EVERY_START, [win(3, 4)])).toEqual([win(3, 4)])
  })
})

describe('handsOnStretches and providerStartWindows', () => {
  const plan = {
    segments: [
      { kind: 'assist', startMinute: 0, endMinute: 5 },
      { kind: 'hands_on', startMinute: 5, endMinute: 15 },
      { kind: 'hands_on', startMinute: 15, endMinute: 20 },
      { kind: 'numbing', startMinute: 20, endMinute: 30 },
      { kind: 'hands_on', startMinute: 30, endMinute: 50 },
      { kind: 'reset', startMinute: 50, endMinute: 60 },
    ],
  } as unknown as OpeningsPlan

  it('joins back-to-back hands-on segments and leaves the numbing gap open', () => {
    expect(handsOnStretches(plan)).toEqual([{ offsetMs: 5 * M, lengthMs: 15 * M }, { offsetMs: 30 * M, lengthMs: 20 * M }])
  })

  it('the provider need only be free for the hands-on stretches: busy during the numbing wait is fine', () => {
    // Free 0–20 and 30–50: a visit starting at 0 needs 5–20 and 30–50; the provider is busy 20–30.
    expect(providerStartWindows([free(0, 20), free(30, 50)], handsOnStretches(plan))).toEqual([win(0, 0)])
  })
})

describe('windowsContain and intervalsTouching', () => {
  it('finds a start inside the sorted windows, edges included', () => {
    const windows = [win(0, 10), win(20, 30), win(40, 50)]
    expect(windowsContain(windows, 20 * M)).toBe(true)
    expect(windowsContain(windows, 30 * M)).toBe(true)
    expect(windowsContain(windows, 35 * M)).toBe(false)
    expect(windowsContain([], 0)).toBe(false)
  })

  it('returns the intervals that overlap a half-open range', () => {
    const list = [free(0, 10), free(20, 30), free(40, 50)]
    expect(intervalsTouching(list, 10 * M, 20 * M)).toEqual([])
    expect(intervalsTouching(list, 5 * M, 21 * M)).toEqual([free(0, 10), free(20, 30)])
    expect(intervalsTouching(list, 45 * M, 99 * M)).toEqual([free(40, 50)])
  })
})
