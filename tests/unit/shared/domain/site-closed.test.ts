// "Is the site closed on this date?" (shared/domain/rota.ts isSiteClosedOn): the Rota screen greys
// these days and availability opens no chair on them. Our own product rule: common practice, no source.
import { describe, expect, it } from 'vitest'
import { expandAvailability, isSiteClosedOn } from '../../../../shared/domain/rota'
import type { SiteCalendar } from '../../../../shared/types/rota'

const WEEKDAYS = [{ start: '08:00', end: '17:00' }]
const site: SiteCalendar = {
  id: 1, timeZone: 'UTC', closedDates: ['2026-12-25'],
  openingHours: { 1: WEEKDAYS, 2: WEEKDAYS, 3: WEEKDAYS, 4: WEEKDAYS, 5: WEEKDAYS, 6: [], 7: [] },
}

describe('isSiteClosedOn', () => {
  it('is closed on a date of its closed list, even on a weekday with hours', () => {
    expect(isSiteClosedOn(site, '2026-12-25')).toBe(true) // a Friday
  })
  it('is closed on a weekday without opening hours', () => {
    expect(isSiteClosedOn(site, '2026-12-26')).toBe(true) // Saturday
    expect(isSiteClosedOn(site, '2026-12-27')).toBe(true) // Sunday
  })
  it('is open on other weekdays with hours', () => {
    expect(isSiteClosedOn(site, '2026-12-24')).toBe(false)
  })
  it('agrees with availability: no chair time on a closed date, chair time on an open one', () => {
    const day = (date: string) => expandAvailability({
      site, operatories: [{ id: 100, siteId: 1, active: true }], shifts: [], exceptions: [], blocks: [],
      fromUtc: `${date}T00:00:00Z`, toUtc: `${date}T23:59:00Z`,
    }).operatories.find((room) => room.operatoryId === 100)?.intervals ?? []
    for (const date of ['2026-12-24', '2026-12-25', '2026-12-26']) {
      expect(day(date).length === 0).toBe(isSiteClosedOn(site, date))
    }
  })
})
