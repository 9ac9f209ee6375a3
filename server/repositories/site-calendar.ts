// Everything the pure availability expansion needs for one site, read in one go.
import type { Db } from '../utils/db'
import type { ExpandAvailabilityInput, OpeningHours } from '#shared/types/rota'
import type { ClockStyle, DateOrder, DisplayStyle } from '#shared/types/display'
import { siteSettingsOf } from '#shared/domain/site-settings'
import { parseJson } from './json'
import { inOneTrip, rowsOf, statement, type Statement } from './round-trip'

export type SiteCalendarInputs = Omit<ExpandAvailabilityInput, 'fromUtc' | 'toUtc'> & {
  bookingUnitMinutes: number
  minimumNoticeMinutes: number
  /** sites.settings as stored (mail settings and the like; see shared/domain/site-settings.ts). */
  settings: Record<string, unknown>
  operatoryDetails: Array<{ id: number; name: string; capabilities: string[]; active: boolean }>
  /** How the site shows times and dates: refusals name times on its clock and in its date order. */
  display: DisplayStyle
}

type SiteRow = Record<string, unknown> & { id: number; time_zone: string; clock: ClockStyle; date_order: DateOrder; opening_hours: unknown; closed_dates: unknown; settings: unknown; booking_unit_minutes: number; calendar_version: number }
type CalendarTables = Pick<SiteCalendarInputs, 'operatories' | 'operatoryDetails' | 'shifts' | 'exceptions' | 'blocks'>

/**
 * Rooms, shifts, exceptions and blocks per site, kept per process and reloaded when the site's
 * calendar_version (counted by triggers, see the migration) moves. Shared between callers: read-only.
 */
const tablesCache = new Map<string, { version: number; tables: CalendarTables }>()

async function loadCalendarTables(db: Db, siteId: number): Promise<CalendarTables> {
  const [operatories, shifts, exceptions, blocks] = await Promise.all([
    db('operatories').where({ site_id: siteId }).orderBy(['sort_order', 'id']),
    db('shifts').where({ site_id: siteId }),
    db('shift_exceptions').where((where) => where.where({ site_id: siteId }).orWhereNull('site_id')),
    db('blocks').where({ site_id: siteId }),
  ])
  return {
    operatories: operatories.map((row) => ({ id: row.id, siteId: row.site_id, active: Boolean(row.active) })),
    operatoryDetails: operatories.map((row) => ({ id: row.id, name: row.name, capabilities: parseJson<string[]>(row.capabilities, []), active: Boolean(row.active) })),
    shifts: shifts.map((row) => ({
      id: row.id, providerId: row.provider_id, siteId: row.site_id, rrule: row.rrule,
      startDate: row.valid_from, untilDate: row.valid_until, localStart: row.local_start, localEnd: row.local_end,
    })),
    exceptions: exceptions.map((row) => ({
      id: row.id, providerId: row.provider_id, kind: row.kind, siteId: row.site_id,
      startDate: row.start_date, endDate: row.end_date, localStart: row.local_start, localEnd: row.local_end, reason: row.reason,
    })),
    blocks: blocks.map((row) => ({
      id: row.id, siteId: row.site_id, operatoryId: row.operatory_id, providerId: row.provider_id, date: row.start_date,
      localStart: row.local_start, localEnd: row.local_end, rrule: row.rrule, untilDate: row.until_date, reason: row.reason,
    })),
  }
}

function databaseOf(db: Db): string {
  return String((db.client.config.connection as { database?: string } | undefined)?.database ?? '')
}

async function calendarTables(db: Db, site: SiteRow, cacheable: boolean): Promise<CalendarTables> {
  if (!cacheable) return loadCalendarTables(db, site.id)
  const key = `${databaseOf(db)}/${site.id}`
  const cached = tablesCache.get(key)
  if (cached && cached.version === site.calendar_version) return cached.tables
  // Read after the version, so the tables are at least as new as the number they are filed under.
  const tables = await loadCalendarTables(db, site.id)
  tablesCache.set(key, { version: site.calendar_version, tables })
  return tables
}

export interface CalendarReadOptions {
  /**
   * For a booking transaction: the site row is read LOCK IN SHARE MODE, so a rota change (whose
   * trigger writes that row) waits for bookings in flight, and a booking after it sees it. Such a
   * transaction writes no calendar rows, so what it reads is committed and may be cached.
   */
  forBooking?: boolean
}

/** A site row and its (cached when allowed) tables as the calendar inputs. */
async function calendarOf(db: Db, site: SiteRow, cacheable: boolean): Promise<SiteCalendarInputs> {
  const tables = await calendarTables(db, site, cacheable)
  const settings = parseJson<Record<string, unknown>>(site.settings, {})
  return {
    site: {
      id: site.id, timeZone: site.time_zone,
      openingHours: parseJson<OpeningHours>(site.opening_hours, {} as OpeningHours),
      closedDates: parseJson<string[]>(site.closed_dates, []),
    },
    bookingUnitMinutes: site.booking_unit_minutes,
    minimumNoticeMinutes: siteSettingsOf(settings).minimumNoticeMinutes,
    settings,
    display: { timeZone: site.time_zone, clock: site.clock, dateOrder: site.date_order },
    ...tables,
  }
}

/**
 * The site row is read fresh every time; the rest comes from the per-process cache when current.
 * Inside any other transaction the rows may be its own uncommitted writes: those are never cached.
 */
export async function loadSiteCalendar(db: Db, siteId: number, options: CalendarReadOptions = {}): Promise<SiteCalendarInputs | undefined> {
  const [calendar] = await inOneTrip(db, [siteCalendarStatement(db, siteId, options)])
  return calendar
}

/** The same read as a statement, to go with others in one round trip (the booking's first). */
export function siteCalendarStatement(db: Db, siteId: number, options: CalendarReadOptions = {}): Statement<SiteCalendarInputs | undefined> {
  const query = db('sites').where({ id: siteId }).first()
  if (options.forBooking) query.forShare()
  return statement(query, (answer) => {
    const site = rowsOf<SiteRow>(answer)[0]
    return site ? calendarOf(db, site, !db.isTransaction || Boolean(options.forBooking)) : undefined
  })
}

/** Several sites' calendars (Balance across sites): their rows in one read, in the order asked; unknown ids are left out. */
export async function loadSiteCalendars(db: Db, siteIds: readonly number[]): Promise<SiteCalendarInputs[]> {
  if (!siteIds.length) return []
  const rows = await db('sites').whereIn('id', siteIds) as SiteRow[]
  const byId = new Map(rows.map((row) => [row.id, row]))
  const found = siteIds.map((id) => byId.get(id)).filter((row): row is SiteRow => row !== undefined)
  return Promise.all(found.map((site) => calendarOf(db, site, !db.isTransaction)))
}

/** Providers who may work at the calendar's site: a shift there, or an extra day there (issue 17: new provider time). */
export function providerIdsAtSite(calendar: SiteCalendarInputs): number[] {
  const extra = calendar.exceptions.filter((exception) => exception.kind === 'extra' && exception.siteId === calendar.site.id)
  return [...new Set([...calendar.shifts.map((shift) => shift.providerId), ...extra.map((exception) => exception.providerId)])]
}
