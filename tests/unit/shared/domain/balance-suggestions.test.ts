// What Balance suggests (issue 17 §3): quiet gaps, rota moves, consolidation moves. Our own rules
// (common practice, no source). Fixed instants: pure functions.
import { describe, expect, it } from 'vitest'
import { consolidationMoves, heldByChair, quietGaps, receivingHours, rotaMoves, type PlacedVisit, type SiteDay } from '../../../../shared/domain/balance-suggestions'
import { localRangeToEpoch } from '../../../../shared/domain/rota'

const M = 60_000
const DAY = Date.UTC(2027, 2, 10, 8) // 08:00 on the day
const at = (minutes: number) => DAY + minutes * M
const span = (from: number, to: number) => ({ startMs: at(from), endMs: at(to) })

describe('heldByChair', () => {
  it("merges each chair's segments on its own and leaves other chairs' time apart", () => {
    const held = heldByChair([
      { operatoryId: 1, ...span(0, 30) }, { operatoryId: 2, ...span(10, 20) }, { operatoryId: 1, ...span(30, 60) },
      { operatoryId: 1, ...span(90, 100) }, { operatoryId: 2, ...span(15, 40) },
    ])
    expect(held).toEqual([{ operatoryId: 1, ...span(0, 60) }, { operatoryId: 1, ...span(90, 100) }, { operatoryId: 2, ...span(10, 40) }])
  })

  it('gives quietGaps the same gaps as the segments themselves', () => {
    const segments = [{ operatoryId: 1, ...span(60, 90) }, { operatoryId: 1, ...span(80, 120) }, { operatoryId: 1, ...span(200, 230) }]
    const input = { operatories: [{ operatoryId: 1, intervals: [span(0, 480)] }], within: [span(0, 480)], nowMs: at(0), minMinutes: 30, limit: 5 }
    expect(quietGaps({ ...input, held: heldByChair(segments) })).toEqual(quietGaps({ ...input, held: segments }))
  })
})

describe('quietGaps', () => {
  it('lists free chair time ahead of now on the quiet days, longest first, at least the minimum long', () => {
    const gaps = quietGaps({
      operatories: [{ operatoryId: 1, intervals: [span(0, 480)] }, { operatoryId: 2, intervals: [span(0, 480)] }],
      held: [{ operatoryId: 1, ...span(60, 120) }, { operatoryId: 1, ...span(150, 480) }, { operatoryId: 2, ...span(0, 240) }],
      within: [span(-480, 960)],
      nowMs: at(30),
      minMinutes: 30,
      limit: 5,
    })
    // Chair 1: 30–60 (the part after now) and 120–150; chair 2: 240–480.
    expect(gaps).toEqual([{ operatoryId: 2, ...span(240, 480) }, { operatoryId: 1, ...span(30, 60) }, { operatoryId: 1, ...span(120, 150) }])
  })

  it('keeps to the quiet days and the limit', () => {
    const gaps = quietGaps({ operatories: [{ operatoryId: 1, intervals: [span(0, 480)] }], held: [], within: [span(300, 400)], nowMs: 0, minMinutes: 30, limit: 1 })
    expect(gaps).toEqual([{ operatoryId: 1, ...span(300, 400) }])
    expect(quietGaps({ operatories: [{ operatoryId: 1, intervals: [span(0, 480)] }], held: [], within: [span(0, 20)], nowMs: 0, minMinutes: 30, limit: 3 })).toEqual([])
  })
})

describe('rotaMoves', () => {
  const day = (siteId: number, share: number, band: SiteDay['band'], onShift: number[], date = '2027-03-10'): SiteDay => ({ siteId, date, share, band, onShift })

  it('suggests a provider on shift at a quiet site who works at a tight one, colleagues left behind first', () => {
    const sites = new Map([[7, [1, 2]], [8, [1, 2]], [9, [1]]])
    const moves = rotaMoves([day(1, 0.2, 'quiet', [7, 9]), day(2, 0.95, 'tight', []), day(3, 0.6, 'steady', [8]), day(1, 0.3, 'quiet', [8], '2027-03-11'), day(2, 0.92, 'tight', [], '2027-03-11')], sites, 5)
    expect(moves).toEqual([
      // Provider 7 leaves provider 9 at site 1; provider 9 does not work at site 2.
      { date: '2027-03-10', providerId: 7, fromSiteId: 1, toSiteId: 2, fromShare: 0.2, toShare: 0.95 },
      { date: '2027-03-11', providerId: 8, fromSiteId: 1, toSiteId: 2, fromShare: 0.3, toShare: 0.92 },
    ])
  })

  it('keeps to the limit for each quiet site', () => {
    const sites = new Map([[7, [1, 2, 3]], [8, [1, 2, 3]]])
    const moves = rotaMoves([day(1, 0.2, 'quiet', [7, 8]), day(2, 0.95, 'tight', []), day(3, 0.99, 'tight', [])], sites, 1)
    expect(moves).toEqual([{ date: '2027-03-10', providerId: 7, fromSiteId: 1, toSiteId: 3, fromShare: 0.2, toShare: 0.99 }])
  })

  it('suggests nothing without a tight site that day, or for a provider already there', () => {
    const sites = new Map([[7, [1, 2]]])
    expect(rotaMoves([day(1, 0.2, 'quiet', [7]), day(2, 0.95, 'tight', [], '2027-03-11')], sites, 5)).toEqual([])
    expect(rotaMoves([day(1, 0.2, 'quiet', [7]), day(2, 0.95, 'tight', [7])], sites, 5)).toEqual([])
  })
})

describe('consolidationMoves', () => {
  const visit = (visitId: number, from: number, to: number, movable = true, providerId = 5): PlacedVisit => ({ visitId, operatoryId: 1, providerId, movable, ...span(from, to) })
  const shifts = new Map([[5, [span(0, 480)]]])

  it('slides a visit between two short free stretches next to its neighbour, joining them', () => {
    // 60–90 and 120–150 are free around visit 2 (90–120): 30 + 30 = 60 minutes once joined.
    const visits = [visit(1, 0, 60), visit(2, 90, 120), visit(3, 150, 480)]
    const moves = consolidationMoves({ operatories: [{ operatoryId: 1, intervals: [span(0, 480)] }], visits, providerShifts: shifts, providerBusy: [], minRunMinutes: 60, limit: 3 })
    expect(moves).toEqual([{ visitId: 2, operatoryId: 1, fromStartMs: at(90), toStartMs: at(60), stretchesMinutes: [30, 30], joinedMinutes: 60 }])
  })

  it('slides the other way when the provider is busy elsewhere, and suggests nothing when neither way is free', () => {
    const visits = [visit(1, 0, 60), visit(2, 90, 120), visit(3, 150, 480)]
    const base = { operatories: [{ operatoryId: 1, intervals: [span(0, 480)] }], visits, providerShifts: shifts, minRunMinutes: 60, limit: 3 }
    expect(consolidationMoves({ ...base, providerBusy: [{ visitId: 9, providerId: 5, ...span(60, 70) }] })[0]?.toStartMs).toBe(at(120))
    expect(consolidationMoves({ ...base, providerBusy: [{ visitId: 9, providerId: 5, ...span(60, 70) }, { visitId: 10, providerId: 5, ...span(140, 150) }] })).toEqual([])
  })

  it('leaves visits that may not move, stretches already long enough, and stretches too short together', () => {
    const chair = [{ operatoryId: 1, intervals: [span(0, 480)] }]
    const run = (visits: PlacedVisit[]) => consolidationMoves({ operatories: chair, visits, providerShifts: shifts, providerBusy: [], minRunMinutes: 60, limit: 3 })
    expect(run([visit(1, 0, 60), visit(2, 90, 120, false), visit(3, 150, 480)])).toEqual([])
    expect(run([visit(1, 0, 60), visit(2, 130, 160), visit(3, 170, 480)])).toEqual([]) // 70 minutes before: bookable already
    expect(run([visit(1, 0, 60), visit(2, 80, 110), visit(3, 130, 480)])).toEqual([]) // 20 + 20 is still too short
  })
})

describe('receivingHours', () => {
  // A summer date: Los Angeles is UTC-7, Denver UTC-6 (both on daylight time; IANA tz data).
  const date = '2027-07-14'
  const denverDay = localRangeToEpoch(date, '00:00', '24:00', 'America/Denver')

  it('keeps the same instants on the receiving site\'s clock, clamped to its opening hours', () => {
    const worked = localRangeToEpoch(date, '08:00', '16:00', 'America/Los_Angeles')
    const open = [localRangeToEpoch(date, '08:00', '12:00', 'America/Denver'), localRangeToEpoch(date, '13:00', '16:30', 'America/Denver')]
    const hours = receivingHours({ worked, open, day: denverDay, zone: 'America/Denver' })
    // 08:00–16:00 in Los Angeles is 09:00–17:00 in Denver; Denver closes at 16:30 (the lunch hour does not split the day).
    expect(hours).toMatchObject({ localStart: '09:00', localEnd: '16:30', startMs: worked.startMs })
  })

  it('clamps a whole day to the receiving date, ending it at 24:00', () => {
    const worked = localRangeToEpoch(date, '00:00', '24:00', 'America/Los_Angeles')
    const hours = receivingHours({ worked, open: [denverDay], day: denverDay, zone: 'America/Denver' })
    expect(hours).toMatchObject({ localStart: '01:00', localEnd: '24:00', endMs: denverDay.endMs })
  })

  it('answers null when the site is closed that date or open only outside those hours', () => {
    const worked = localRangeToEpoch(date, '08:00', '10:00', 'America/Los_Angeles')
    expect(receivingHours({ worked, open: [], day: denverDay, zone: 'America/Denver' })).toBeNull()
    expect(receivingHours({ worked, open: [localRangeToEpoch(date, '14:00', '18:00', 'America/Denver')], day: denverDay, zone: 'America/Denver' })).toBeNull()
  })
})
