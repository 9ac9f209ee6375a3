// The waitlist matcher (issue 17 §2): the openings engine restricted to a freed gap, then each entry's
// own wishes; ranked by priority, then by how long the entry has waited. Pure, with fixed instants.
import { describe, expect, it } from 'vitest'
import type { OpeningsSite } from '../../../../shared/types/openings'
import { firstFitFor, matchWaitlist, offerExpiresAtMs, openingsInGap, type FreedGap, type WaitlistCandidate } from '../../../../shared/domain/waitlist-match'

const HOUR = 3_600_000
const DAY_START = Date.parse('2027-01-11T08:00:00Z') // a Monday, 08:00 UTC
const site: OpeningsSite = {
  id: 1, timeZone: 'UTC', bookingUnitMinutes: 15,
  operatories: [{ id: 10, siteId: 1, active: true, capabilities: ['restorative'] }, { id: 11, siteId: 1, active: true, capabilities: ['hygiene'] }],
  providers: [{ id: 20, categories: ['restorative'] }],
  availability: {
    operatories: [{ operatoryId: 10, intervals: [{ startMs: DAY_START, endMs: DAY_START + 9 * HOUR }] }, { operatoryId: 11, intervals: [{ startMs: DAY_START, endMs: DAY_START + 9 * HOUR }] }],
    providers: [{ providerId: 20, siteId: 1, intervals: [{ startMs: DAY_START, endMs: DAY_START + 9 * HOUR }] }],
    blocks: [],
  },
} as unknown as OpeningsSite
const hourPlan = { segments: [{ kind: 'hands_on' as const, startMinute: 0, endMinute: 60 }], chairMinutes: 60 }
const gap: FreedGap = { siteId: 1, operatoryId: 10, timeZone: 'UTC', startMs: DAY_START + 2 * HOUR, endMs: DAY_START + 3 * HOUR }
const nowMs = DAY_START - 24 * HOUR

function entry(id: number, changes: Partial<WaitlistCandidate> = {}): WaitlistCandidate {
  return { id, siteIds: [1], fromDate: '2027-01-10', toDate: '2027-01-12', partOfDay: 'any', noticeMinutes: 0, priority: 3, createdAtMs: id, planKey: 'fill', ...changes }
}

describe('openingsInGap', () => {
  const query = { plan: hourPlan, capability: 'restorative' as const, category: 'restorative' as const, sites: [site], busy: [], nowMs, minimumNoticeMinutes: 0 }
  it('starts only inside the freed window, on its chair', () => {
    const openings = openingsInGap(query, gap)
    expect(openings.length).toBeGreaterThan(0)
    expect(openings.every((o) => o.operatoryId === 10 && o.startMs >= gap.startMs && o.startMs < gap.endMs)).toBe(true)
    expect(openings[0]!.startMs).toBe(gap.startMs)
  })
  it('a chair without the capability fits nothing', () => {
    expect(openingsInGap(query, { ...gap, operatoryId: 11 })).toEqual([])
  })
  it('no provider who does the procedure on shift: nothing', () => {
    expect(openingsInGap({ ...query, category: 'hygiene' as never }, gap)).toEqual([])
  })
})

describe('matchWaitlist', () => {
  const openings = [{ siteId: 1, operatoryId: 10, providerId: 20, startMs: gap.startMs, endMs: gap.startMs + HOUR }]
  const byPlan = new Map([['fill', openings]])
  it('ranks by priority, then by the longest wait', () => {
    const matches = matchWaitlist({ gap, entries: [entry(3), entry(1), entry(2, { priority: 1 })], openingsByPlan: byPlan, nowMs })
    expect(matches.map((match) => match.entryId)).toEqual([2, 1, 3])
  })
  it('leaves out other sites, other dates, the wrong part of day, a notice the time cannot meet and another plan', () => {
    const entries = [
      entry(1, { siteIds: [2] }), entry(2, { fromDate: '2027-01-12' }), entry(3, { partOfDay: 'afternoon' }),
      entry(4, { noticeMinutes: 27 * 60 }), entry(5, { planKey: 'crown' }), entry(6),
    ]
    expect(matchWaitlist({ gap, entries, openingsByPlan: byPlan, nowMs }).map((match) => match.entryId)).toEqual([6])
  })
  it('takes the first start the entry accepts', () => {
    const later = { ...openings[0]!, startMs: gap.startMs + 30 * 60_000 }
    expect(firstFitFor(entry(1, { noticeMinutes: 24 * 60 + 130 }), [openings[0]!, later], gap, nowMs)).toEqual(later)
  })
})

describe('offerExpiresAtMs', () => {
  it('the site window after sending, never past the start minus the notice, none when that has passed', () => {
    expect(offerExpiresAtMs({ nowMs: 0, slotStartMs: 10 * HOUR, noticeMinutes: 60, offerHours: 2 })).toBe(2 * HOUR)
    expect(offerExpiresAtMs({ nowMs: 0, slotStartMs: 2 * HOUR, noticeMinutes: 60, offerHours: 2 })).toBe(HOUR)
    expect(offerExpiresAtMs({ nowMs: 0, slotStartMs: HOUR, noticeMinutes: 60, offerHours: 2 })).toBeNull()
  })
})
