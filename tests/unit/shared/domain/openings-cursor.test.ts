import { describe, expect, it } from 'vitest'
import { StartCursor, walkStartsInOrder, type Pairing } from '../../../../shared/domain/openings-cursor'

const M = 60_000
const BASE = Date.parse('2026-03-10T16:00:00Z') // 09:00 in Los Angeles (PDT)

function pairing(overrides: Partial<Pairing>): Pairing {
  return {
    siteId: 1, operatoryId: 1, providerId: 1, timeZone: 'America/Los_Angeles', unitMinutes: 15, rank: 0,
    windows: [{ firstMs: BASE, lastMs: BASE + 30 * M }], ...overrides,
  }
}

describe('StartCursor', () => {
  it('walks the grid starts of its windows, earliest first, then stops', () => {
    const cursor = new StartCursor(pairing({ windows: [{ firstMs: BASE + 1 * M, lastMs: BASE + 30 * M }, { firstMs: BASE + 60 * M, lastMs: BASE + 60 * M }] }), 'any')
    const starts: number[] = []
    while (cursor.current !== null) {
      starts.push((cursor.current - BASE) / M)
      cursor.advance()
    }
    expect(starts).toEqual([15, 30, 60])
  })

  it('skips starts outside the part of day asked for', () => {
    // 11:30 to 12:30 local: only 12:00 onwards are afternoon starts.
    const cursor = new StartCursor(pairing({ windows: [{ firstMs: BASE + 150 * M, lastMs: BASE + 210 * M }] }), 'afternoon')
    expect((cursor.current! - BASE) / M).toBe(180)
  })
})

describe('walkStartsInOrder', () => {
  it('merges every pairing in time order, lower rank first on a tie, and stops when asked', () => {
    const a = pairing({ operatoryId: 1, rank: 1 })
    const b = pairing({ operatoryId: 2, rank: 0, windows: [{ firstMs: BASE + 15 * M, lastMs: BASE + 45 * M }] })
    const seen: string[] = []
    walkStartsInOrder([a, b], 'any', ({ pairing: p, startMs }) => {
      seen.push(`${(startMs - BASE) / M}@${p.operatoryId}`)
      return seen.length < 5
    })
    expect(seen).toEqual(['0@1', '15@2', '15@1', '30@2', '30@1'])
  })

  it('calls nothing when no pairing has a start', () => {
    let calls = 0
    walkStartsInOrder([pairing({ windows: [] })], 'any', () => { calls++; return true })
    expect(calls).toBe(0)
  })
})
