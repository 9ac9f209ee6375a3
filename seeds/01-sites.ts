// Fernhollow Dental Group (invented): three sites in three time zones, with their rooms.
import { DateTime } from 'luxon'
import type { SeedContext } from './context'

/** The days every demo site is closed: Christmas Day and New Year's Day (month-day). */
export const DEMO_CLOSED_MONTH_DAYS = ['12-25', '01-01'] as const

/**
 * The demo's closed dates: the next Christmas Day and New Year's Day on or after `today` (yyyy-MM-dd),
 * so a demo seeded on any date shows upcoming closures, never dates long past.
 */
export function demoClosedDates(today: string = DateTime.utc().toISODate()!): string[] {
  const year = Number(today.slice(0, 4))
  return DEMO_CLOSED_MONTH_DAYS
    .map((monthDay) => (`${year}-${monthDay}` >= today ? `${year}-${monthDay}` : `${year + 1}-${monthDay}`))
    .sort()
}

const weekdays = (start: string, end: string) => [{ start, end }]

export const DEMO_SITES = [
  {
    slug: 'quarry-street', name: 'Fernhollow Quarry Street', time_zone: 'America/Los_Angeles',
    address: '48 Quarry Street, Fernhollow', phone: '(209) 555-0148', colour: '#0f766e',
    booking_unit_minutes: 5, tooth_notation: 'universal', clock: '12h', date_order: 'month-day-year',
    hours: { 1: weekdays('07:30', '17:30'), 2: weekdays('07:30', '17:30'), 3: weekdays('07:30', '17:30'), 4: weekdays('07:30', '17:30'), 5: weekdays('07:30', '16:00'), 6: weekdays('08:00', '13:00'), 7: [] },
    rooms: ['Chair 1', 'Chair 2', 'Chair 3', 'Hygiene A', 'Hygiene B'],
  },
  {
    slug: 'aspen-gulch', name: 'Fernhollow Aspen Gulch', time_zone: 'America/Denver',
    address: '7 Aspen Gulch Road, Fernhollow', phone: '(307) 555-0177', colour: '#b45309',
    booking_unit_minutes: 10, tooth_notation: 'universal', clock: '24h', date_order: 'month-day-year',
    hours: { 1: weekdays('08:00', '17:00'), 2: weekdays('08:00', '17:00'), 3: weekdays('08:00', '17:00'), 4: weekdays('08:00', '17:00'), 5: weekdays('08:00', '15:00'), 6: [], 7: [] },
    rooms: ['Chair 1', 'Chair 2', 'Hygiene A', 'Hygiene B'],
  },
  {
    slug: 'saguaro-flats', name: 'Fernhollow Saguaro Flats', time_zone: 'America/Phoenix',
    address: '1200 Saguaro Flats Drive, Fernhollow', phone: '(520) 555-0112', colour: '#7c3aed',
    booking_unit_minutes: 15, tooth_notation: 'iso', clock: '12h', date_order: 'month-day-year',
    hours: { 1: weekdays('07:00', '16:00'), 2: weekdays('07:00', '16:00'), 3: weekdays('07:00', '16:00'), 4: weekdays('07:00', '16:00'), 5: weekdays('07:00', '12:00'), 6: [], 7: [] },
    rooms: ['Chair 1', 'Chair 2', 'Hygiene A'],
  },
] as const

function capabilitiesFor(room: string): string[] {
  return room.startsWith('Hygiene') ? ['hygiene', 'pediatric'] : ['restorative', 'surgical', 'imaging', 'pediatric']
}

export async function seedSites(ctx: SeedContext): Promise<void> {
  for (const site of DEMO_SITES) {
    const [siteId] = await ctx.db('sites').insert({
      slug: site.slug, name: site.name, time_zone: site.time_zone, address: site.address, phone: site.phone,
      email: `${site.slug.split('-')[0]}@fernhollow.test`, colour: site.colour,
      booking_unit_minutes: site.booking_unit_minutes, tooth_notation: site.tooth_notation,
      clock: site.clock, date_order: site.date_order,
      opening_hours: JSON.stringify(site.hours),
      closed_dates: JSON.stringify(demoClosedDates()),
      settings: JSON.stringify({ reminderOffsetsHours: [48, 3], quietHours: { start: '20:00', end: '08:00' }, includeProcedureNames: false, minimumNoticeMinutes: 60 }),
    })
    ctx.sites[site.slug] = siteId as number
    ctx.operatories[site.slug] = []
    for (const [index, room] of site.rooms.entries()) {
      const [operatoryId] = await ctx.db('operatories').insert({
        site_id: siteId, name: room, capabilities: JSON.stringify(capabilitiesFor(room)), sort_order: index + 1,
      })
      ctx.operatories[site.slug]!.push(operatoryId as number)
    }
  }
}
