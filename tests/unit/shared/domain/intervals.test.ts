import fc from 'fast-check'
import { describe, expect, it } from 'vitest'
import {
  clipIntervals,
  fromUtcInterval,
  intersectIntervals,
  intervalsOverlap,
  mergeIntervals,
  parseUtcInstant,
  subtractIntervals,
  toUtcInterval,
  totalDurationMs,
} from '../../../../shared/domain/intervals'
import type { EpochInterval } from '../../../../shared/types/rota'

const iv = (startMs: number, endMs: number): EpochInterval => ({ startMs, endMs })

describe('mergeIntervals', () => {
  it('sorts, joins overlapping and touching intervals, and drops empty ones', () => {
    expect(mergeIntervals([iv(50, 60), iv(0, 10), iv(10, 20), iv(15, 30), iv(40, 40), iv(45, 44)])).toEqual([
      iv(0, 30),
      iv(50, 60),
    ])
  })

  it('keeps a contained interval inside the outer one', () => {
    expect(mergeIntervals([iv(0, 100), iv(20, 30)])).toEqual([iv(0, 100)])
  })

  it('does not mutate its input', () => {
    const input = [iv(10, 20), iv(0, 15)]
    mergeIntervals(input)
    expect(input).toEqual([iv(10, 20), iv(0, 15)])
  })

  it('gives merged input back as a new list with the same intervals, and merges it again when it only touches', () => {
    const merged = [iv(0, 10), iv(20, 30)]
    const again = mergeIntervals(merged)
    expect(again).toEqual(merged)
    expect(again).not.toBe(merged)
    expect(mergeIntervals([iv(0, 10), iv(10, 30)])).toEqual([iv(0, 30)])
    expect(mergeIntervals([iv(0, 10), iv(5, 5)])).toEqual([iv(0, 10)])
  })

  it('joins input already in order of start without sorting it, dropping empty ones and not touching the input', () => {
    const input = [iv(0, 10), iv(5, 5), iv(5, 20), iv(5, 8), iv(30, 40), iv(40, 45), iv(50, 49)]
    expect(mergeIntervals(input)).toEqual([iv(0, 20), iv(30, 45)])
    expect(input[0]).toEqual(iv(0, 10))
  })

  it('gives the same for any order of the same intervals (property check)', () => {
    fc.assert(fc.property(arbList, (list) => {
      const inOrder = [...list].sort((a, b) => a.startMs - b.startMs)
      expect(mergeIntervals(inOrder)).toEqual(mergeIntervals([...list].reverse()))
    }))
  })

  it('merging twice gives what merging once gave (property check)', () => {
    fc.assert(fc.property(arbList, (list) => {
      const once = mergeIntervals(list)
      expect(mergeIntervals(once)).toEqual(once)
    }))
  })
})

describe('subtractIntervals', () => {
  it('cuts holes out of the middle, the edges and whole pieces', () => {
    const base = [iv(0, 100), iv(200, 300), iv(400, 500)]
    const cuts = [iv(10, 20), iv(90, 210), iv(400, 500), iv(600, 700)]
    expect(subtractIntervals(base, cuts)).toEqual([iv(0, 10), iv(20, 90), iv(210, 300)])
  })

  it('leaves the base alone when the cuts only touch it', () => {
    expect(subtractIntervals([iv(10, 20)], [iv(0, 10), iv(20, 30)])).toEqual([iv(10, 20)])
  })

  it('handles one cut spanning several base pieces and unsorted input', () => {
    expect(subtractIntervals([iv(50, 60), iv(0, 10), iv(20, 30)], [iv(5, 55)])).toEqual([iv(0, 5), iv(55, 60)])
  })

  it('returns the merged base when there are no cuts', () => {
    expect(subtractIntervals([iv(0, 10), iv(5, 20)], [])).toEqual([iv(0, 20)])
  })
})

describe('intersectIntervals and clipIntervals', () => {
  it('keeps only shared time', () => {
    expect(intersectIntervals([iv(0, 10), iv(20, 30)], [iv(5, 25)])).toEqual([iv(5, 10), iv(20, 25)])
  })

  it('has nothing in common for touching intervals (half-open)', () => {
    expect(intersectIntervals([iv(0, 10)], [iv(10, 20)])).toEqual([])
  })

  it('clips to a window', () => {
    expect(clipIntervals([iv(0, 10), iv(20, 30), iv(40, 50)], 5, 45)).toEqual([iv(5, 10), iv(20, 30), iv(40, 45)])
  })
})

describe('intervalsOverlap and totalDurationMs', () => {
  it('treats touching as not overlapping', () => {
    expect(intervalsOverlap(iv(0, 10), iv(10, 20))).toBe(false)
    expect(intervalsOverlap(iv(0, 11), iv(10, 20))).toBe(true)
  })

  it('counts overlapping time once', () => {
    expect(totalDurationMs([iv(0, 10), iv(5, 15), iv(20, 25)])).toBe(20)
  })
})

describe('ISO conversion', () => {
  it('round-trips through ISO strings ending in Z', () => {
    const interval = { startUtc: '2026-03-09T15:00:00.000Z', endUtc: '2026-03-10T00:00:00.000Z' }
    expect(fromUtcInterval(interval)).toEqual(iv(Date.UTC(2026, 2, 9, 15), Date.UTC(2026, 2, 10)))
    expect(toUtcInterval(fromUtcInterval(interval))).toEqual(interval)
  })

  it('reads explicit offsets and refuses instants without one (the machine zone must not leak in)', () => {
    expect(parseUtcInstant('2026-03-09T08:00:00-07:00')).toBe(Date.UTC(2026, 2, 9, 15))
    expect(() => parseUtcInstant('2026-03-09T08:00:00')).toThrow(RangeError)
    expect(() => parseUtcInstant('not a dateZ')).toThrow(RangeError)
  })
})

// Property checks: interval algebra laws, sampled at every integer instant of a small range.
const arbInterval = fc.tuple(fc.integer({ min: 0, max: 60 }), fc.integer({ min: 0, max: 60 })).map(([a, b]) => iv(Math.min(a, b), Math.max(a, b)))
const arbList = fc.array(arbInterval, { maxLength: 8 })
const covers = (list: EpochInterval[], t: number): boolean => list.some((i) => i.startMs <= t && t < i.endMs)
const instants = Array.from({ length: 61 }, (_, t) => t)

describe('interval algebra (property checks)', () => {
  it('merge, subtract and intersect agree with set membership at every instant', () => {
    fc.assert(
      fc.property(arbList, arbList, (a, b) => {
        const merged = mergeIntervals(a)
        const difference = subtractIntervals(a, b)
        const common = intersectIntervals(a, b)
        for (const t of instants) {
          if (covers(merged, t) !== covers(a, t)) return false
          if (covers(difference, t) !== (covers(a, t) && !covers(b, t))) return false
          if (covers(common, t) !== (covers(a, t) && covers(b, t))) return false
        }
        return true
      }),
    )
  })

  it('always returns sorted, disjoint, non-touching, non-empty intervals', () => {
    fc.assert(
      fc.property(arbList, arbList, (a, b) =>
        [mergeIntervals(a), subtractIntervals(a, b), intersectIntervals(a, b)].every((list) =>
          list.every((i, k) => i.endMs > i.startMs && (k === 0 || list[k - 1]!.endMs <= i.startMs)),
        ),
      ),
    )
  })
})
