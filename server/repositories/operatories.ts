// Operatories (treatment rooms) of a site.
import type { Db } from '../utils/db'
import type { OperatorySummary } from '#shared/types/sites'
import type { OperatoryBody, OperatoryPatch } from '#shared/schemas/sites'
import { parseJson } from './json'

interface OperatoryRow {
  id: number
  site_id: number
  name: string
  capabilities: string
  active: number
  sort_order: number
}

function toSummary(row: OperatoryRow): OperatorySummary {
  return {
    id: row.id,
    siteId: row.site_id,
    name: row.name,
    capabilities: parseJson<string[]>(row.capabilities, []),
    active: Boolean(row.active),
    sortOrder: row.sort_order,
  }
}

export async function listOperatories(db: Db, siteId: number): Promise<OperatorySummary[]> {
  const rows = await db<OperatoryRow>('operatories').where({ site_id: siteId }).orderBy(['sort_order', 'id'])
  return rows.map(toSummary)
}

export async function findOperatory(db: Db, id: number): Promise<OperatorySummary | undefined> {
  const row = await db<OperatoryRow>('operatories').where({ id }).first()
  return row ? toSummary(row) : undefined
}

/** New rooms go to the end of the site's order unless told otherwise. */
export async function insertOperatory(db: Db, room: OperatoryBody): Promise<number> {
  const last = await db('operatories').where({ site_id: room.siteId }).max({ highest: 'sort_order' }).first()
  const sortOrder = room.sortOrder ?? Number(last?.highest ?? 0) + 1
  const [id] = await db('operatories').insert({
    site_id: room.siteId,
    name: room.name,
    capabilities: JSON.stringify([...new Set(room.capabilities)]),
    active: room.active,
    sort_order: sortOrder,
  })
  return id as number
}

export async function updateOperatory(db: Db, id: number, patch: OperatoryPatch): Promise<void> {
  const columns: Record<string, unknown> = {}
  if (patch.name !== undefined) columns.name = patch.name
  if (patch.capabilities !== undefined) columns.capabilities = JSON.stringify([...new Set(patch.capabilities)])
  if (patch.active !== undefined) columns.active = patch.active
  if (patch.sortOrder !== undefined) columns.sort_order = patch.sortOrder
  if (Object.keys(columns).length === 0) return
  await db('operatories').where({ id }).update({ ...columns, updated_at: db.fn.now(3) })
}
