// What a change to a visit frees (issue 17 §2): common practice, no source.
import { describe, expect, it } from 'vitest'
import { addedProviderTime, freedByChange, largestFreed } from '../../../../shared/domain/freed-time'

const MIN = 60_000
const span = (startMin: number, endMin: number, operatoryId = 1) => ({ siteId: 1, operatoryId, startMs: startMin * MIN, endMs: endMin * MIN })

describe('freed time', () => {
  it('a shortened visit frees its tail', () => {
    expect(freedByChange(span(0, 60), span(0, 40))).toEqual([span(40, 60)])
  })
  it('a visit made longer or unchanged frees nothing', () => {
    expect(freedByChange(span(0, 60), span(0, 90))).toEqual([])
    expect(freedByChange(span(0, 60), span(0, 60))).toEqual([])
  })
  it('a move on the same chair frees what the new time leaves uncovered', () => {
    expect(freedByChange(span(0, 60), span(30, 90))).toEqual([span(0, 30)])
    expect(freedByChange(span(30, 90), span(0, 60))).toEqual([span(60, 90)])
    expect(freedByChange(span(0, 60), span(120, 180))).toEqual([span(0, 60)])
  })
  it('a move to another chair frees the whole slot', () => {
    expect(freedByChange(span(0, 60, 1), span(0, 60, 2))).toEqual([span(0, 60, 1)])
  })
  it('a visit both moved inside its slot and shortened frees head and tail; the largest is shown', () => {
    const parts = freedByChange(span(0, 90), span(10, 40))
    expect(parts).toEqual([span(0, 10), span(40, 90)])
    expect(largestFreed(parts)).toEqual(span(40, 90))
    expect(largestFreed([])).toBeNull()
  })
})

describe('time a new shift adds', () => {
  const HOUR = 3_600_000
  const at = (startH: number, endH: number) => ({ startMs: startH * HOUR, endMs: endH * HOUR })
  it('is the provider\'s time with it minus their time without it', () => {
    expect(addedProviderTime([at(8, 12), at(13, 17), at(32, 40)], [at(8, 12)])).toEqual([at(13, 17), at(32, 40)])
    expect(addedProviderTime([at(8, 17)], [at(8, 12)])).toEqual([at(12, 17)])
    expect(addedProviderTime([at(8, 12)], [at(8, 12)])).toEqual([])
  })
  it('cuts long stretches into gaps of at most 12 hours and keeps the first few', () => {
    expect(addedProviderTime([at(0, 30)], [])).toEqual([at(0, 12), at(12, 24), at(24, 30)])
    expect(addedProviderTime([at(0, 24 * 30)], [], 3)).toHaveLength(3)
  })
})
