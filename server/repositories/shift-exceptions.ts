// Shift exceptions: time off (a date range, one site or all) and extra one-off shifts.
import type { Db } from '../utils/db'
import type { ShiftExceptionBody } from '#shared/schemas/rota'
import type { ShiftExceptionInput, ShiftExceptionKind } from '#shared/types/rota'
import type { ShiftExceptionDto } from '#shared/types/rota-api'

interface ExceptionRow {
  id: number
  provider_id: number
  site_id: number | null
  kind: ShiftExceptionKind
  start_date: string
  end_date: string
  local_start: string | null
  local_end: string | null
  reason: string
}

function toDto(row: ExceptionRow): ShiftExceptionDto {
  return {
    id: row.id,
    providerId: row.provider_id,
    kind: row.kind,
    siteId: row.site_id,
    startDate: row.start_date,
    endDate: row.end_date,
    localStart: row.local_start,
    localEnd: row.local_end,
    reason: row.reason,
  }
}

export function exceptionToInput(exception: ShiftExceptionDto): ShiftExceptionInput {
  return { ...exception }
}

export interface ExceptionFilter {
  /** Exceptions at these sites, plus time off that applies everywhere (site_id null). */
  siteIds?: readonly number[]
  providerId?: number
  from?: string
  to?: string
}

export async function listShiftExceptions(db: Db, filter: ExceptionFilter): Promise<ShiftExceptionDto[]> {
  const query = db<ExceptionRow>('shift_exceptions').orderBy(['start_date', 'id'])
  if (filter.siteIds) query.where((q) => q.whereIn('site_id', [...filter.siteIds!]).orWhereNull('site_id'))
  if (filter.providerId !== undefined) query.where({ provider_id: filter.providerId })
  if (filter.from) query.where('end_date', '>=', filter.from)
  if (filter.to) query.where('start_date', '<=', filter.to)
  return (await query).map(toDto)
}

export async function findShiftException(db: Db, id: number): Promise<ShiftExceptionDto | undefined> {
  const row = await db<ExceptionRow>('shift_exceptions').where({ id }).first()
  return row ? toDto(row) : undefined
}

export async function insertShiftException(db: Db, exception: ShiftExceptionBody): Promise<number> {
  const [id] = await db('shift_exceptions').insert({
    provider_id: exception.providerId,
    site_id: exception.siteId,
    kind: exception.kind,
    start_date: exception.startDate,
    end_date: exception.endDate,
    local_start: exception.localStart,
    local_end: exception.localEnd,
    reason: exception.reason,
  })
  return id as number
}

export async function deleteShiftException(db: Db, id: number): Promise<void> {
  await db('shift_exceptions').where({ id }).delete()
}
