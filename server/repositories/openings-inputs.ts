// Reads what the openings search needs beyond the site calendar: providers and busy segments.
import type { Db } from '../utils/db'
// Relative, not #shared: the group-scale benchmark loads this file under tsx.
import { earliestOverlappingStart } from '../../shared/domain/input-bounds'
import type { BusySegment } from '#shared/types/openings'
import { parseJson } from './json'
import { epochMs } from './epoch-ms'
import { allOf, inOneTrip, rowsOf, statement } from './round-trip'

export interface ProviderRow { id: number; name: string; categories: string[] }

export async function providersByIds(db: Db, ids: number[]): Promise<ProviderRow[]> {
  if (!ids.length) return []
  const rows = await db('providers').join('users', 'users.id', 'providers.user_id')
    .whereIn('providers.id', ids).where('providers.active', true).where('users.active', true)
    .select('providers.id', 'users.name', 'providers.capabilities')
  return rows.map((row) => ({ id: row.id, name: row.name, categories: parseJson<string[]>(row.capabilities, []) }))
}

type BusyCells = [operatoryId: number, providerId: number | null, kind: BusySegment['kind'], startMs: number | string, endMs: number | string]

function busyQuery(db: Db, operatoryIds: readonly number[], providerIds: readonly number[], fromMs: number, toMs: number) {
  return db('visit_segments')
    .where('start_utc', '<', new Date(toMs)).where('start_utc', '>', earliestOverlappingStart(fromMs)).where('end_utc', '>', new Date(fromMs))
    .where((who) => {
      if (operatoryIds.length) who.orWhereIn('operatory_id', operatoryIds)
      if (providerIds.length) who.orWhere((hands) => hands.whereIn('provider_id', providerIds).where('kind', 'hands_on'))
    })
    .select('operatory_id', 'provider_id', 'kind', epochMs(db, 'start_utc', 'start_ms'), epochMs(db, 'end_utc', 'end_ms'))
    .orderBy(['operatory_id', 'start_utc'])
}

function toBusy(cells: BusyCells): BusySegment {
  return { operatoryId: cells[0], providerId: cells[1], kind: cells[2], startMs: Number(cells[3]), endMs: Number(cells[4]) }
}

/**
 * Live segments in these rooms, or of these providers anywhere (a provider works at several sites),
 * in order of chair and start: the chair index's own order, so each chair's segments come sorted and
 * merging them skips the sort (`mergeIntervals`).
 */
export async function busySegments(db: Db, operatoryIds: number[], providerIds: number[], fromMs: number, toMs: number): Promise<BusySegment[]> {
  if (!operatoryIds.length && !providerIds.length) return []
  const rows = await busyQuery(db, operatoryIds, providerIds, fromMs, toMs).options({ rowsAsArray: true }) as unknown as BusyCells[]
  return rows.map(toBusy)
}

/** Round trips the chair reads of many sites are spread over, run at once on as many connections. */
const CHAIR_READ_TRIPS = 8

/**
 * Each site's chairs' live segments over its own span, as `busySegments` gives them: one promise per
 * site, settled when its round trip answers, so the caller can work on a site's segments and let them
 * go while others are still on their way. One read per site (a single read of every chair, an IN list
 * of 400 at group scale, made MariaDB scan the whole table), sent in a few round trips at once: one trip
 * for all of them ran them one after another on one connection, one each cost a socket write apiece
 * (issue 19 §3).
 */
export function chairSegmentsOfSites(db: Db, sites: ReadonlyArray<{ operatoryIds: readonly number[]; fromMs: number; toMs: number }>): Array<Promise<BusySegment[]>> {
  const reads = sites.map((site) => site.operatoryIds.length
    ? statement(busyQuery(db, site.operatoryIds, [], site.fromMs, site.toMs), (answer) => rowsOf<BusyCells>(answer).map(toBusy))
    : allOf<never>([]))
  const perTrip = Math.max(1, Math.ceil(reads.length / CHAIR_READ_TRIPS))
  const perSite = reads.flatMap((_, at) => {
    if (at % perTrip) return []
    const trip = inOneTrip(db, reads.slice(at, at + perTrip), { rowsAsArray: true })
    return reads.slice(at, at + perTrip).map((__, index) => trip.then((answers) => answers[index]!))
  })
  // The caller awaits each site's read in its own time; a failed trip is thrown there, not reported
  // as unhandled while the caller is still busy with an earlier site.
  for (const read of perSite) read.catch(() => undefined)
  return perSite
}
