// Reads what the openings search needs beyond the site calendar: providers and busy segments.
import type { Db } from '../utils/db'
// Relative, not #shared: the group-scale benchmark loads this file under tsx.
import { earliestOverlappingStart } from '../../shared/domain/input-bounds'
import type { BusySegment } from '#shared/types/openings'
import { parseJson } from './json'
import { epochMs } from './epoch-ms'

export interface ProviderRow { id: number; name: string; categories: string[] }

export async function providersByIds(db: Db, ids: number[]): Promise<ProviderRow[]> {
  if (!ids.length) return []
  const rows = await db('providers').join('users', 'users.id', 'providers.user_id')
    .whereIn('providers.id', ids).where('providers.active', true).where('users.active', true)
    .select('providers.id', 'users.name', 'providers.capabilities')
  return rows.map((row) => ({ id: row.id, name: row.name, categories: parseJson<string[]>(row.capabilities, []) }))
}

/** Live segments in these rooms, or of these providers anywhere (a provider works at several sites). */
export async function busySegments(db: Db, operatoryIds: number[], providerIds: number[], fromMs: number, toMs: number): Promise<BusySegment[]> {
  if (!operatoryIds.length && !providerIds.length) return []
  const rows: Array<{ operatory_id: number; provider_id: number | null; kind: BusySegment['kind']; start_ms: number | string; end_ms: number | string }> = await db('visit_segments')
    .where('start_utc', '<', new Date(toMs)).where('start_utc', '>', earliestOverlappingStart(fromMs)).where('end_utc', '>', new Date(fromMs))
    .where((who) => {
      if (operatoryIds.length) who.orWhereIn('operatory_id', operatoryIds)
      if (providerIds.length) who.orWhere((hands) => hands.whereIn('provider_id', providerIds).where('kind', 'hands_on'))
    })
    .select('operatory_id', 'provider_id', 'kind', epochMs(db, 'start_utc', 'start_ms'), epochMs(db, 'end_utc', 'end_ms'))
  return rows.map((row) => ({ operatoryId: row.operatory_id, providerId: row.provider_id, kind: row.kind, startMs: Number(row.start_ms), endMs: Number(row.end_ms) }))
}
