// Providers (dentists and hygienists): one per staff account, scoped to sites through the account.
import type { Db } from '../utils/db'
import type { ProviderKind, ProviderSummary } from '#shared/types/people'
import type { ProviderBody, ProviderPatch } from '#shared/schemas/people'
import { ROLE_GROUPS } from '#shared/utils/access'
import { parseJson } from './json'

interface ProviderRow {
  id: number
  user_id: number
  name: string
  /** users.role: the one source of a provider's kind. */
  kind: ProviderKind
  colour: string
  capabilities: string
  active: number
  all_sites: number
}

/** Provider rows whose account is a dentist or hygienist; the kind is the account's role. */
function baseQuery(db: Db) {
  return db('providers as p')
    .join('users as u', 'u.id', 'p.user_id')
    .whereIn('u.role', ROLE_GROUPS.providers)
    .select<ProviderRow[]>('p.id', 'p.user_id', 'u.name', 'u.role as kind', 'p.colour', 'p.capabilities', 'p.active', 'u.all_sites')
}

async function withSites(db: Db, rows: ProviderRow[]): Promise<ProviderSummary[]> {
  if (rows.length === 0) return []
  const links: { user_id: number; site_id: number }[] = await db('user_sites').whereIn('user_id', rows.map((row) => row.user_id)).select('user_id', 'site_id')
  const allSiteIds: number[] = rows.some((row) => row.all_sites) ? (await db('sites').select('id')).map((site: { id: number }) => site.id) : []
  return rows.map((row) => ({
    id: row.id,
    userId: row.user_id,
    name: row.name,
    kind: row.kind,
    colour: row.colour,
    capabilities: parseJson<string[]>(row.capabilities, []),
    active: Boolean(row.active),
    siteIds: row.all_sites ? allSiteIds : links.filter((link) => link.user_id === row.user_id).map((link) => link.site_id).sort((a, b) => a - b),
  }))
}

/** Providers whose account covers the site (or every provider when siteId is null). */
export async function listProviders(db: Db, siteId: number | null): Promise<ProviderSummary[]> {
  const query = baseQuery(db).orderBy('u.name')
  if (siteId !== null) {
    query.where((scope) => scope.where('u.all_sites', true).orWhereExists(
      db('user_sites').whereRaw('user_sites.user_id = u.id').where('user_sites.site_id', siteId),
    ))
  }
  return withSites(db, await query)
}

export async function findProvider(db: Db, id: number): Promise<ProviderSummary | undefined> {
  const [provider] = await withSites(db, await baseQuery(db).where('p.id', id))
  return provider
}

export async function findProviderIdOfUser(db: Db, userId: number): Promise<number | null> {
  const row = await db('providers').where({ user_id: userId }).first('id')
  return row ? (row.id as number) : null
}

/**
 * Locks the provider's row by writing it: shift saves for one provider run one at a time (clash
 * check). Written, not only read FOR UPDATE, because Galera certifies written rows only: two saves
 * that both write the row conflict on any node (1213, retried), even while a new writer still applies
 * the old one's last transactions.
 */
export async function lockProvider(db: Db, id: number): Promise<boolean> {
  const changed = await db('providers').where({ id }).increment('booking_seq', 1)
  return changed === 1
}

export async function insertProvider(db: Db, provider: ProviderBody): Promise<number> {
  const [id] = await db('providers').insert({
    user_id: provider.userId,
    colour: provider.colour,
    capabilities: JSON.stringify([...new Set(provider.capabilities)]),
  })
  return id as number
}

export async function updateProvider(db: Db, id: number, patch: ProviderPatch): Promise<void> {
  const columns: Record<string, unknown> = {}
  if (patch.colour !== undefined) columns.colour = patch.colour
  if (patch.capabilities !== undefined) columns.capabilities = JSON.stringify([...new Set(patch.capabilities)])
  if (patch.active !== undefined) columns.active = patch.active
  if (Object.keys(columns).length === 0) return
  await db('providers').where({ id }).update({ ...columns, updated_at: db.fn.now(3) })
}
