// Everything the pure availability expansion needs for one site, read in one go.
import type { Db } from '../utils/db'
import type { ExpandAvailabilityInput, OpeningHours } from '#shared/types/rota'
import { parseJson } from './json'

export type SiteCalendarInputs = Omit<ExpandAvailabilityInput, 'fromUtc' | 'toUtc'> & {
  bookingUnitMinutes: number
  minimumNoticeMinutes: number
  operatoryDetails: Array<{ id: number; name: string; capabilities: string[]; active: boolean }>
}

/** DATE columns come back as Date at UTC midnight (timezone 'Z'); the rota speaks 'YYYY-MM-DD'. */
export function localDateOf(value: Date | string | null): string | null {
  if (value === null) return null
  return typeof value === 'string' ? value.slice(0, 10) : value.toISOString().slice(0, 10)
}

export async function loadSiteCalendar(db: Db, siteId: number): Promise<SiteCalendarInputs | undefined> {
  const site = await db('sites').where({ id: siteId }).first()
  if (!site) return undefined
  const [operatories, shifts, exceptions, blocks] = await Promise.all([
    db('operatories').where({ site_id: siteId }).orderBy(['sort_order', 'id']),
    db('shifts').where({ site_id: siteId }),
    db('shift_exceptions').where((where) => where.where({ site_id: siteId }).orWhereNull('site_id')),
    db('blocks').where({ site_id: siteId }),
  ])
  const settings = parseJson<{ minimumNoticeMinutes?: number }>(site.settings, {})
  return {
    site: {
      id: site.id, timeZone: site.time_zone,
      openingHours: parseJson<OpeningHours>(site.opening_hours, {} as OpeningHours),
      closedDates: parseJson<string[]>(site.closed_dates, []),
    },
    bookingUnitMinutes: site.booking_unit_minutes,
    minimumNoticeMinutes: settings.minimumNoticeMinutes ?? 60,
    operatories: operatories.map((row) => ({ id: row.id, siteId: row.site_id, active: Boolean(row.active) })),
    operatoryDetails: operatories.map((row) => ({ id: row.id, name: row.name, capabilities: parseJson<string[]>(row.capabilities, []), active: Boolean(row.active) })),
    shifts: shifts.map((row) => ({
      id: row.id, providerId: row.provider_id, siteId: row.site_id, rrule: row.rrule,
      startDate: localDateOf(row.valid_from)!, untilDate: localDateOf(row.valid_until), localStart: row.local_start, localEnd: row.local_end,
    })),
    exceptions: exceptions.map((row) => ({
      id: row.id, providerId: row.provider_id, kind: row.kind, siteId: row.site_id,
      startDate: localDateOf(row.start_date)!, endDate: localDateOf(row.end_date)!, localStart: row.local_start, localEnd: row.local_end, reason: row.reason,
    })),
    blocks: blocks.map((row) => ({
      id: row.id, siteId: row.site_id, operatoryId: row.operatory_id, providerId: row.provider_id, date: localDateOf(row.start_date)!,
      localStart: row.local_start, localEnd: row.local_end, rrule: row.rrule, untilDate: localDateOf(row.until_date), reason: row.reason,
    })),
  }
}

export interface ProviderDetails {
  id: number
  name: string
  kind: 'dentist' | 'hygienist'
  capabilities: string[]
  active: boolean
}

export async function findProviderDetails(db: Db, providerId: number): Promise<ProviderDetails | undefined> {
  const row = await db('providers').join('users', 'users.id', 'providers.user_id').where('providers.id', providerId)
    .first('providers.id', 'users.name', 'providers.kind', 'providers.capabilities', 'providers.active')
  return row ? { id: row.id, name: row.name, kind: row.kind, capabilities: parseJson<string[]>(row.capabilities, []), active: Boolean(row.active) } : undefined
}
