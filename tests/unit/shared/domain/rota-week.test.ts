// What the Rota week draws. Zone rules from the IANA tz database (Los Angeles: PST, UTC−8, in January).
import { describe, expect, it } from 'vitest'
import { buildWeeklyRule } from '../../../../shared/domain/recurrence/build'
import { rotaEntries, type RotaWeekInput } from '../../../../shared/domain/rota-week'
import type { OpeningHours, SiteCalendar } from '../../../../shared/types/rota'

const NINE_TO_FIVE = [{ start: '09:00', end: '17:00' }]
const WEEKDAYS: OpeningHours = { '1': NINE_TO_FIVE, '2': NINE_TO_FIVE, '3': NINE_TO_FIVE, '4': NINE_TO_FIVE, '5': NINE_TO_FIVE, '6': [], '7': [] }
const SITE: SiteCalendar = { id: 1, timeZone: 'America/Los_Angeles', openingHours: WEEKDAYS, closedDates: ['2026-01-14'] }

// Monday 12 to Sunday 18 January 2026.
function week(overrides: Partial<RotaWeekInput> = {}): RotaWeekInput {
  return {
    sites: [SITE],
    shifts: [{ id: 10, providerId: 7, siteId: 1, rrule: buildWeeklyRule({ weekdays: [1, 3, 5] }), startDate: '2026-01-05', untilDate: null, localStart: '08:00', localEnd: '12:00' }],
    exceptions: [],
    blocks: [],
    fromDate: '2026-01-12',
    toDate: '2026-01-18',
    providerName: (id) => `Provider ${id}`,
    ...overrides,
  }
}

describe('rotaEntries', () => {
  it('draws each shift occurrence with its wall times and UTC instants, skipping closed dates', () => {
    const entries = rotaEntries(week())
    expect(entries.map((e) => e.date)).toEqual(['2026-01-12', '2026-01-16']) // Wednesday 14th is closed
    expect(entries[0]).toMatchObject({ kind: 'shift', sourceId: 10, providerId: 7, localStart: '08:00', localEnd: '12:00', label: 'Provider 7' })
    expect(entries[0]!.startUtc).toBe('2026-01-12T16:00:00.000Z')
    expect(entries[0]!.endUtc).toBe('2026-01-12T20:00:00.000Z')
  })

  it('time off without hours covers the whole local day and names its reason', () => {
    const entries = rotaEntries(week({
      shifts: [],
      exceptions: [{ id: 70, providerId: 7, kind: 'time_off', siteId: null, startDate: '2026-01-10', endDate: '2026-01-12', localStart: null, localEnd: null, reason: 'course' }],
    }))
    expect(entries).toHaveLength(1) // only the 12th lies in the week
    expect(entries[0]).toMatchObject({ kind: 'time_off', date: '2026-01-12', localStart: null, label: 'Provider 7: time off (course)' })
    // Time off from every site has no zone of its own: the grid places it by its date.
    expect(entries[0]!.startUtc).toBe('2026-01-12T00:00:00.000Z')
    const atSite = rotaEntries(week({
      shifts: [],
      exceptions: [{ id: 72, providerId: 7, kind: 'time_off', siteId: 1, startDate: '2026-01-12', endDate: '2026-01-12', localStart: null, localEnd: null }],
    }))
    expect(atSite[0]).toMatchObject({ startUtc: '2026-01-12T08:00:00.000Z', endUtc: '2026-01-13T08:00:00.000Z', label: 'Provider 7: time off' })
  })

  it('an extra day without hours follows the site\'s opening hours', () => {
    const entries = rotaEntries(week({
      shifts: [],
      exceptions: [{ id: 71, providerId: 8, kind: 'extra', siteId: 1, startDate: '2026-01-13', endDate: '2026-01-13', localStart: null, localEnd: null }],
    }))
    expect(entries).toEqual([expect.objectContaining({ kind: 'extra', date: '2026-01-13', localStart: '09:00', localEnd: '17:00', label: 'Provider 8 (extra)' })])
  })

  it('puts blocks first on a date at the same time, and ignores rows of sites not in view', () => {
    const entries = rotaEntries(week({
      blocks: [
        { id: 50, siteId: 1, operatoryId: 3, providerId: null, date: '2026-01-12', localStart: '08:00', localEnd: '09:00', rrule: null, untilDate: null, reason: 'Handpiece service' },
        { id: 51, siteId: 2, operatoryId: null, providerId: null, date: '2026-01-12', localStart: '08:00', localEnd: '09:00', rrule: null, untilDate: null, reason: 'Elsewhere' },
      ],
    }))
    expect(entries.slice(0, 2).map((e) => [e.kind, e.label])).toEqual([['block', 'Handpiece service'], ['shift', 'Provider 7']])
    expect(entries.some((e) => e.label === 'Elsewhere')).toBe(false)
  })
})
