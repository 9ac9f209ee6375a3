// Day columns: visible hours and side-by-side lanes (My day, week views, Rota grid).
import { describe, expect, it } from 'vitest'
import { laneSpans, visibleHours } from '../../../../shared/utils/day-grid'

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

describe('visible hours', () => {
  it('shows 07:00–18:00 at least and widens to what the spans need, within the day', () => {
    expect(visibleHours([])).toEqual({ first: 7, last: 18 })
    expect(visibleHours([{ startMinutes: 6 * 60 + 30, endMinutes: 19 * 60 + 10 }])).toEqual({ first: 6, last: 20 })
    expect(visibleHours([{ startMinutes: -30, endMinutes: 1500 }])).toEqual({ first: 0, last: 24 })
  })
})
