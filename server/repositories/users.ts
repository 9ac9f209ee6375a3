// Staff accounts and their site scopes.
import type { Db } from '../utils/db'
import type { Role, SessionUser } from '#shared/types/auth'
import { ROLE_GROUPS } from '#shared/utils/access'

export interface UserRow {
  id: number
  email: string
  name: string
  password_hash: string
  role: Role
  all_sites: number
  active: number
  session_version: number
}

export interface NewUser {
  email: string
  name: string
  passwordHash: string
  role: Role
  allSites: boolean
  siteIds: number[]
}

export async function findUserByEmail(db: Db, email: string): Promise<UserRow | undefined> {
  return db<UserRow>('users').where({ email }).first()
}

export async function findUserById(db: Db, id: number): Promise<UserRow | undefined> {
  return db<UserRow>('users').where({ id }).first()
}

export async function siteIdsOfUser(db: Db, userId: number): Promise<number[]> {
  const rows = await db('user_sites').where({ user_id: userId }).orderBy('site_id').select('site_id')
  return rows.map((row: { site_id: number }) => row.site_id)
}

export function toSessionUser(row: UserRow, siteIds: number[]): SessionUser {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    allSites: Boolean(row.all_sites),
    siteIds,
  }
}

export async function insertUser(db: Db, user: NewUser): Promise<number> {
  const [id] = await db('users').insert({
    email: user.email,
    name: user.name,
    password_hash: user.passwordHash,
    role: user.role,
    all_sites: user.allSites,
  })
  if (user.siteIds.length) {
    await db('user_sites').insert(user.siteIds.map((siteId) => ({ user_id: id, site_id: siteId })))
  }
  return id as number
}

export async function recordSignIn(db: Db, userId: number): Promise<void> {
  await db('users').where({ id: userId }).update({ last_sign_in_at: db.fn.now(3) })
}

/** Invalidates every cookie issued so far for this user. */
export async function bumpSessionVersion(db: Db, userId: number): Promise<void> {
  await db('users').where({ id: userId }).increment('session_version', 1).update({ updated_at: db.fn.now(3) })
}

export async function setUserActive(db: Db, userId: number, active: boolean): Promise<void> {
  await db('users').where({ id: userId }).update({ active, updated_at: db.fn.now(3) }).increment('session_version', 1)
}

export async function setPasswordHash(db: Db, userId: number, passwordHash: string): Promise<void> {
  await db('users').where({ id: userId }).update({ password_hash: passwordHash, updated_at: db.fn.now(3) }).increment('session_version', 1)
}

export interface StaffRow extends UserRow {
  last_sign_in_at: Date | null
  provider_id: number | null
}

/**
 * Accounts with their provider id (only while the role is a provider role: a former provider's row is
 * kept for its history but is no longer theirs to show), optionally only those whose scope meets the sites.
 */
export async function listStaffRows(db: Db, scope: { allSites: boolean; siteIds: number[] }): Promise<StaffRow[]> {
  const query = db('users as u')
    .leftJoin('providers as p', (join) => join.on('p.user_id', 'u.id').onIn('u.role', ROLE_GROUPS.providers))
    .select<StaffRow[]>('u.*', 'p.id as provider_id')
    .orderBy('u.name')
  if (!scope.allSites) {
    query.where((q) => q.where('u.all_sites', true).orWhereExists(
      db('user_sites').whereRaw('user_sites.user_id = u.id').whereIn('user_sites.site_id', scope.siteIds),
    ))
  }
  return query
}

export async function siteIdsByUser(db: Db, userIds: readonly number[]): Promise<Map<number, number[]>> {
  const links: { user_id: number; site_id: number }[] = userIds.length
    ? await db('user_sites').whereIn('user_id', [...userIds]).orderBy('site_id').select('user_id', 'site_id')
    : []
  const byUser = new Map<number, number[]>()
  for (const link of links) byUser.set(link.user_id, [...(byUser.get(link.user_id) ?? []), link.site_id])
  return byUser
}

export async function updateUserProfile(db: Db, userId: number, patch: { name?: string; role?: Role; allSites?: boolean }): Promise<void> {
  const columns: Record<string, unknown> = {}
  if (patch.name !== undefined) columns.name = patch.name
  if (patch.role !== undefined) columns.role = patch.role
  if (patch.allSites !== undefined) columns.all_sites = patch.allSites
  if (Object.keys(columns).length === 0) return
  await db('users').where({ id: userId }).update({ ...columns, updated_at: db.fn.now(3) })
}

export async function replaceUserSites(db: Db, userId: number, siteIds: readonly number[]): Promise<void> {
  await db('user_sites').where({ user_id: userId }).delete()
  if (siteIds.length) await db('user_sites').insert([...new Set(siteIds)].map((siteId) => ({ user_id: userId, site_id: siteId })))
}

/** The user and their site scope in one round trip (the session guard runs this on every API call). */
export async function findUserWithSites(db: Db, id: number): Promise<{ row: UserRow; siteIds: number[] } | undefined> {
  const row = await db('users').leftJoin('user_sites', 'user_sites.user_id', 'users.id').where('users.id', id)
    .groupBy('users.id').first('users.*', db.raw('GROUP_CONCAT(user_sites.site_id ORDER BY user_sites.site_id) AS site_ids'))
  if (!row) return undefined
  const { site_ids: siteIds, ...user } = row as UserRow & { site_ids: string | null }
  return { row: user, siteIds: siteIds ? siteIds.split(',').map(Number) : [] }
}
