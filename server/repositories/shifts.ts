// Shifts: a provider's recurring hours at a site (RRULE + site-local times and dates).
import type { Db } from '../utils/db'
import type { ShiftBody } from '#shared/schemas/rota'
import type { ShiftInput } from '#shared/types/rota'
import type { ShiftDto } from '#shared/types/rota-api'
import { describeRule } from '#shared/domain/recurrence/describe'

interface ShiftRow {
  id: number
  provider_id: number
  site_id: number
  rrule: string
  valid_from: string
  valid_until: string | null
  local_start: string
  local_end: string
  note: string
}

function toDto(row: ShiftRow): ShiftDto {
  return {
    id: row.id,
    providerId: row.provider_id,
    siteId: row.site_id,
    rrule: row.rrule,
    ruleText: describeRule(row.rrule),
    validFrom: row.valid_from,
    validUntil: row.valid_until,
    localStart: row.local_start,
    localEnd: row.local_end,
    note: row.note,
  }
}

export function shiftToInput(shift: ShiftDto): ShiftInput {
  return {
    id: shift.id,
    providerId: shift.providerId,
    siteId: shift.siteId,
    rrule: shift.rrule,
    startDate: shift.validFrom,
    untilDate: shift.validUntil,
    localStart: shift.localStart,
    localEnd: shift.localEnd,
  }
}

function columns(shift: ShiftBody) {
  return {
    provider_id: shift.providerId,
    site_id: shift.siteId,
    rrule: shift.rrule,
    valid_from: shift.validFrom,
    valid_until: shift.validUntil,
    local_start: shift.localStart,
    local_end: shift.localEnd,
    note: shift.note,
  }
}

export interface ShiftFilter {
  siteIds?: readonly number[]
  providerId?: number
  /** Only shifts that can occur on or after this date / on or before that one. */
  activeFrom?: string
  activeTo?: string
}

export async function listShifts(db: Db, filter: ShiftFilter): Promise<ShiftDto[]> {
  const query = db<ShiftRow>('shifts').orderBy(['site_id', 'provider_id', 'id'])
  if (filter.siteIds) query.whereIn('site_id', [...filter.siteIds])
  if (filter.providerId !== undefined) query.where({ provider_id: filter.providerId })
  if (filter.activeFrom) query.where((q) => q.whereNull('valid_until').orWhere('valid_until', '>=', filter.activeFrom!))
  if (filter.activeTo) query.where('valid_from', '<=', filter.activeTo)
  return (await query).map(toDto)
}

export async function findShift(db: Db, id: number): Promise<ShiftDto | undefined> {
  const row = await db<ShiftRow>('shifts').where({ id }).first()
  return row ? toDto(row) : undefined
}

export async function insertShift(db: Db, shift: ShiftBody): Promise<number> {
  const [id] = await db('shifts').insert(columns(shift))
  return id as number
}

export async function updateShift(db: Db, id: number, shift: ShiftBody): Promise<void> {
  await db('shifts').where({ id }).update({ ...columns(shift), updated_at: db.fn.now(3) })
}

export async function deleteShift(db: Db, id: number): Promise<void> {
  await db('shifts').where({ id }).delete()
}
