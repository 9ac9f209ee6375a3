// Sites (offices) of the group.
import type { Db } from '../utils/db'
import type { SiteSummary } from '#shared/types/auth'
import type { SiteDetail } from '#shared/types/sites'
import type { ToothNotation } from '#shared/types/teeth'
import type { ClockStyle, DateOrder } from '#shared/types/display'
import type { OpeningHours, SiteCalendar } from '#shared/types/rota'
import type { SiteBody, SitePatch } from '#shared/schemas/sites'
import { parseJson } from './json'

interface SiteRow {
  id: number
  name: string
  slug: string
  time_zone: string
  colour: string
  booking_unit_minutes: number
  tooth_notation: ToothNotation
  late_after_minutes: number
  clock: ClockStyle
  date_order: DateOrder
  address: string
  phone: string
  email: string
  opening_hours: string
  closed_dates: string
  active: number
}

const NO_HOURS: OpeningHours = { '1': [], '2': [], '3': [], '4': [], '5': [], '6': [], '7': [] }

type SummaryRow = Pick<SiteRow, 'id' | 'name' | 'slug' | 'time_zone' | 'colour' | 'booking_unit_minutes' | 'tooth_notation' | 'late_after_minutes' | 'clock' | 'date_order'>

function toSummary(row: SummaryRow): SiteSummary {
  return {
    id: row.id,
    name: row.name,
    slug: row.slug,
    timeZone: row.time_zone,
    colour: row.colour,
    bookingUnitMinutes: row.booking_unit_minutes,
    toothNotation: row.tooth_notation,
    lateAfterMinutes: row.late_after_minutes,
    clock: row.clock,
    dateOrder: row.date_order,
  }
}

function toDetail(row: SiteRow): SiteDetail {
  return {
    ...toSummary(row),
    address: row.address,
    phone: row.phone,
    email: row.email,
    openingHours: { ...NO_HOURS, ...parseJson<Partial<OpeningHours>>(row.opening_hours, {}) },
    closedDates: parseJson<string[]>(row.closed_dates, []),
    active: Boolean(row.active),
  }
}

export function toCalendar(site: SiteDetail): SiteCalendar {
  return { id: site.id, timeZone: site.timeZone, openingHours: site.openingHours, closedDates: site.closedDates }
}

/** Sites the user may see: every active site, or only the listed ones. */
export async function listSites(db: Db, scope: { allSites: boolean; siteIds: number[] }): Promise<SiteSummary[]> {
  const query = db<SiteRow>('sites').where('active', true).orderBy('name')
  if (!scope.allSites) query.whereIn('id', scope.siteIds)
  return (await query.select('id', 'name', 'slug', 'time_zone', 'colour', 'booking_unit_minutes', 'tooth_notation', 'late_after_minutes', 'clock', 'date_order')).map(toSummary)
}

/** The same scope, with contact and calendar, including inactive sites (for the admin's table). */
export async function listSiteDetails(db: Db, scope: { allSites: boolean; siteIds: number[] }): Promise<SiteDetail[]> {
  const query = db<SiteRow>('sites').orderBy('name')
  if (!scope.allSites) query.whereIn('id', scope.siteIds)
  return (await query).map(toDetail)
}

export async function findSite(db: Db, id: number): Promise<SiteSummary | undefined> {
  const row = await db<SiteRow>('sites').where({ id }).first()
  return row ? toSummary(row) : undefined
}

export async function findSiteDetail(db: Db, id: number): Promise<SiteDetail | undefined> {
  const row = await db<SiteRow>('sites').where({ id }).first()
  return row ? toDetail(row) : undefined
}

export async function findSiteDetails(db: Db, ids: readonly number[]): Promise<SiteDetail[]> {
  if (ids.length === 0) return []
  return (await db<SiteRow>('sites').whereIn('id', [...ids])).map(toDetail)
}

function siteColumns(site: SitePatch): Record<string, unknown> {
  const columns: Record<string, unknown> = {}
  if (site.name !== undefined) columns.name = site.name
  if (site.slug !== undefined) columns.slug = site.slug
  if (site.timeZone !== undefined) columns.time_zone = site.timeZone
  if (site.address !== undefined) columns.address = site.address
  if (site.phone !== undefined) columns.phone = site.phone
  if (site.email !== undefined) columns.email = site.email
  if (site.colour !== undefined) columns.colour = site.colour
  if (site.bookingUnitMinutes !== undefined) columns.booking_unit_minutes = site.bookingUnitMinutes
  if (site.toothNotation !== undefined) columns.tooth_notation = site.toothNotation
  if (site.lateAfterMinutes !== undefined) columns.late_after_minutes = site.lateAfterMinutes
  if (site.clock !== undefined) columns.clock = site.clock
  if (site.dateOrder !== undefined) columns.date_order = site.dateOrder
  if (site.openingHours !== undefined) columns.opening_hours = JSON.stringify(site.openingHours)
  if (site.closedDates !== undefined) columns.closed_dates = JSON.stringify([...new Set(site.closedDates)].sort())
  if (site.active !== undefined) columns.active = site.active
  return columns
}

/** Which of these ids are sites (active or not). */
export async function existingSiteIds(db: Db, ids: readonly number[]): Promise<Set<number>> {
  if (ids.length === 0) return new Set()
  const rows = await db('sites').whereIn('id', [...ids]).select<{ id: number }[]>('id')
  return new Set(rows.map((row) => row.id))
}

export async function insertSite(db: Db, site: SiteBody & { slug: string }): Promise<number> {
  const [id] = await db('sites').insert({ ...siteColumns(site), settings: JSON.stringify({}) })
  return id as number
}

export async function updateSite(db: Db, id: number, patch: SitePatch): Promise<void> {
  const columns = siteColumns(patch)
  if (Object.keys(columns).length === 0) return
  await db('sites').where({ id }).update({ ...columns, updated_at: db.fn.now(3) })
}

/** sites.settings as stored; `forUpdate` locks the row for a change that follows in the same transaction. */
export async function findStoredSettings(db: Db, id: number, options: { forUpdate?: boolean } = {}): Promise<Record<string, unknown> | undefined> {
  const query = db('sites').where({ id }).first('settings')
  if (options.forUpdate) query.forUpdate()
  const row = await query
  return row ? parseJson<Record<string, unknown>>(row.settings, {}) : undefined
}

export async function writeStoredSettings(db: Db, id: number, settings: Record<string, unknown>): Promise<void> {
  await db('sites').where({ id }).update({ settings: JSON.stringify(settings), updated_at: db.fn.now(3) })
}
