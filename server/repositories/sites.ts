// Sites (offices) of the group.
import type { Db } from '../utils/db'
import type { SiteSummary } from '#shared/types/auth'

interface SiteRow {
  id: number
  name: string
  slug: string
  time_zone: string
  colour: string
  booking_unit_minutes: number
  tooth_notation: 'universal' | 'iso'
}

function toSummary(row: SiteRow): SiteSummary {
  return {
    id: row.id,
    name: row.name,
    slug: row.slug,
    timeZone: row.time_zone,
    colour: row.colour,
    bookingUnitMinutes: row.booking_unit_minutes,
    toothNotation: row.tooth_notation,
  }
}

/** Sites the user may see: every active site, or only the listed ones. */
export async function listSites(db: Db, scope: { allSites: boolean; siteIds: number[] }): Promise<SiteSummary[]> {
  const query = db<SiteRow>('sites').where({ active: true }).orderBy('name')
  if (!scope.allSites) query.whereIn('id', scope.siteIds)
  return (await query.select('id', 'name', 'slug', 'time_zone', 'colour', 'booking_unit_minutes', 'tooth_notation')).map(toSummary)
}

export async function findSite(db: Db, id: number): Promise<SiteSummary | undefined> {
  const row = await db<SiteRow>('sites').where({ id }).first()
  return row ? toSummary(row) : undefined
}
