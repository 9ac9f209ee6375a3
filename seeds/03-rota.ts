// Who works where: weekly shifts (RRULE, local wall time in each site's zone) and blocks.
import { DateTime } from 'luxon'
import type { SeedContext } from './context'

const VALID_FROM = '2026-01-05'

/**
 * A date in next calendar week (Monday = 1), so the demo's one-off block and time off are always
 * upcoming and on screen, and never in the weeks the tests book (two weeks ahead and later).
 */
function nextWeek(weekday: number): string {
  return DateTime.utc().startOf('week').plus({ weeks: 1, days: weekday - 1 }).toISODate()!
}

interface ShiftSeed { provider: string; site: string; rrule: string; start: string; end: string }

export const DEMO_SHIFTS: ShiftSeed[] = [
  // The demo dentist moves between two sites on set days.
  { provider: 'dentist.main', site: 'quarry-street', rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,TH', start: '07:30', end: '16:30' },
  { provider: 'dentist.main', site: 'saguaro-flats', rrule: 'FREQ=WEEKLY;BYDAY=WE,FR', start: '07:00', end: '15:00' },
  { provider: 'dentist.2', site: 'aspen-gulch', rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH', start: '08:00', end: '17:00' },
  { provider: 'dentist.3', site: 'quarry-street', rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', start: '08:00', end: '16:00' },
  { provider: 'dentist.4', site: 'saguaro-flats', rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,TH', start: '07:00', end: '16:00' },
  { provider: 'dentist.4', site: 'aspen-gulch', rrule: 'FREQ=WEEKLY;INTERVAL=2;BYDAY=FR', start: '08:00', end: '15:00' },
  { provider: 'hygienist.main', site: 'aspen-gulch', rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', start: '08:00', end: '15:00' },
  { provider: 'hygienist.2', site: 'quarry-street', rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH', start: '07:30', end: '17:30' },
  { provider: 'hygienist.3', site: 'saguaro-flats', rrule: 'FREQ=WEEKLY;BYDAY=TU,WE,TH,FR', start: '07:00', end: '16:00' },
  { provider: 'hygienist.3', site: 'quarry-street', rrule: 'FREQ=MONTHLY;BYDAY=1MO', start: '08:00', end: '17:00' },
]

export async function seedRota(ctx: SeedContext): Promise<void> {
  await ctx.db('shifts').insert(DEMO_SHIFTS.map((shift) => ({
    provider_id: ctx.providers[shift.provider], site_id: ctx.sites[shift.site], rrule: shift.rrule,
    valid_from: VALID_FROM, valid_until: null, local_start: shift.start, local_end: shift.end,
  })))

  type BlockRow = { site_id: number; operatory_id: number | null; provider_id: number | null; start_date: string; local_start: string; local_end: string; rrule: string | null; until_date: string | null; reason: string }
  const blocks: BlockRow[] = Object.entries(ctx.sites).flatMap(([slug, siteId]): BlockRow[] => [
    { site_id: siteId, operatory_id: null, provider_id: null, start_date: VALID_FROM, local_start: '12:00', local_end: '12:45', rrule: 'FREQ=WEEKLY;BYDAY=MO,TU,WE,TH,FR', until_date: null, reason: 'Lunch' },
    ...(slug === 'quarry-street'
      ? [{ site_id: siteId, operatory_id: null, provider_id: null, start_date: VALID_FROM, local_start: '07:30', local_end: '08:00', rrule: 'FREQ=MONTHLY;BYDAY=1TU', until_date: null, reason: 'Staff meeting' }]
      : []),
  ])
  blocks.push({
    site_id: ctx.sites['aspen-gulch']!, operatory_id: ctx.operatories['aspen-gulch']![1]!, provider_id: null,
    start_date: nextWeek(4), local_start: '13:00', local_end: '17:00', rrule: null, until_date: null, reason: 'Equipment service',
  })
  await ctx.db('blocks').insert(blocks)
  await ctx.db('shift_exceptions').insert({
    provider_id: ctx.providers['dentist.3'], site_id: null, kind: 'time_off', start_date: nextWeek(1), end_date: nextWeek(4), local_start: null, local_end: null, reason: 'Holiday',
  })
}
