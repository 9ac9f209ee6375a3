// Operatories (treatment rooms) of a site.
import type { Db } from '../utils/db'
import type { OperatorySummary } from '#shared/types/sites'
import { parseJson } from './json'

interface OperatoryRow {
  id: number
  site_id: number
  name: string
  capabilities: string
  active: number
  sort_order: number
}

export async function listOperatories(db: Db, siteId: number): Promise<OperatorySummary[]> {
  const rows = await db<OperatoryRow>('operatories').where({ site_id: siteId }).orderBy(['sort_order', 'id'])
  return rows.map((row) => ({
    id: row.id,
    siteId: row.site_id,
    name: row.name,
    capabilities: parseJson<string[]>(row.capabilities, []),
    active: Boolean(row.active),
    sortOrder: row.sort_order,
  }))
}
