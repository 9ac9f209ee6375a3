// Blocks: unbookable time for a site, a chair or a provider; one-off or recurring.
import type { Db } from '../utils/db'
import type { BlockBody } from '#shared/schemas/rota'
import type { BlockInput } from '#shared/types/rota'
import type { BlockDto } from '#shared/types/rota-api'
import { describeRule } from '#shared/domain/recurrence/describe'

interface BlockRow {
  id: number
  site_id: number
  operatory_id: number | null
  provider_id: number | null
  start_date: string
  local_start: string
  local_end: string
  rrule: string | null
  until_date: string | null
  reason: string
}

function toDto(row: BlockRow): BlockDto {
  return {
    id: row.id,
    siteId: row.site_id,
    operatoryId: row.operatory_id,
    providerId: row.provider_id,
    startDate: row.start_date,
    localStart: row.local_start,
    localEnd: row.local_end,
    rrule: row.rrule,
    ruleText: row.rrule === null ? null : describeRule(row.rrule),
    untilDate: row.until_date,
    reason: row.reason,
  }
}

export function blockToInput(block: BlockDto): BlockInput {
  return {
    id: block.id,
    siteId: block.siteId,
    operatoryId: block.operatoryId,
    providerId: block.providerId,
    date: block.startDate,
    localStart: block.localStart,
    localEnd: block.localEnd,
    rrule: block.rrule,
    untilDate: block.untilDate,
    reason: block.reason,
  }
}

function columns(block: BlockBody) {
  return {
    site_id: block.siteId,
    operatory_id: block.operatoryId,
    provider_id: block.providerId,
    start_date: block.startDate,
    local_start: block.localStart,
    local_end: block.localEnd,
    rrule: block.rrule,
    until_date: block.untilDate,
    reason: block.reason,
  }
}

export interface BlockFilter {
  siteIds?: readonly number[]
  providerId?: number
  from?: string
  to?: string
}

/** Blocks that can occur in [from, to]: one-offs on a date inside, recurring ones still running. */
export async function listBlocks(db: Db, filter: BlockFilter): Promise<BlockDto[]> {
  const query = db<BlockRow>('blocks').orderBy(['site_id', 'start_date', 'id'])
  if (filter.siteIds) query.whereIn('site_id', [...filter.siteIds])
  if (filter.providerId !== undefined) query.where({ provider_id: filter.providerId })
  if (filter.to) query.where('start_date', '<=', filter.to)
  if (filter.from) {
    const from = filter.from
    query.where((q) => q
      .where((oneOff) => oneOff.whereNull('rrule').where('start_date', '>=', from))
      .orWhere((recurring) => recurring.whereNotNull('rrule').where((until) => until.whereNull('until_date').orWhere('until_date', '>=', from))))
  }
  return (await query).map(toDto)
}

export async function findBlock(db: Db, id: number): Promise<BlockDto | undefined> {
  const row = await db<BlockRow>('blocks').where({ id }).first()
  return row ? toDto(row) : undefined
}

export async function insertBlock(db: Db, block: BlockBody): Promise<number> {
  const [id] = await db('blocks').insert(columns(block))
  return id as number
}

export async function updateBlock(db: Db, id: number, block: BlockBody): Promise<void> {
  await db('blocks').where({ id }).update(columns(block))
}

export async function deleteBlock(db: Db, id: number): Promise<void> {
  await db('blocks').where({ id }).delete()
}
