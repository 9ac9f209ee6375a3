// Staff accounts: create (with a provider row for dentists and hygienists), change, deactivate,
// reset password. Deactivation and password resets bump session_version, ending old sessions.
import type { SessionUser } from '#shared/types/auth'
import type { StaffAccount } from '#shared/types/people'
import { isProviderRole } from '#shared/utils/access'
import type { StaffBody, StaffPatch } from '#shared/schemas/people'
import type { Db } from '../utils/db'
import { badRequest, conflict, isDuplicateKey, notFound } from '../utils/errors'
import {
  findUserById, insertUser, listStaffRows, replaceUserSites, setPasswordHash, setUserActive, siteIdsByUser,
  updateUserProfile, type StaffRow,
} from '../repositories/users'
import { findProviderIdOfUser, insertProvider } from '../repositories/providers'
import { writeAudit } from '../repositories/audit-log'

const DEFAULT_PROVIDER_COLOUR = '#2563eb'

function toAccount(row: StaffRow, siteIds: number[]): StaffAccount {
  return {
    id: row.id,
    email: row.email,
    name: row.name,
    role: row.role,
    allSites: Boolean(row.all_sites),
    siteIds,
    active: Boolean(row.active),
    lastSignInAt: row.last_sign_in_at ? new Date(row.last_sign_in_at).toISOString() : null,
    providerId: row.provider_id,
  }
}

export async function listStaff(db: Db, scope: { allSites: boolean; siteIds: number[] }): Promise<StaffAccount[]> {
  const rows = await listStaffRows(db, scope)
  const sites = await siteIdsByUser(db, rows.map((row) => row.id))
  return rows.map((row) => toAccount(row, sites.get(row.id) ?? []))
}

export async function findStaff(db: Db, id: number): Promise<StaffAccount> {
  const account = (await listStaff(db, { allSites: true, siteIds: [] })).find((row) => row.id === id)
  if (!account) throw notFound('No such staff account.')
  return account
}

async function checkSites(db: Db, siteIds: readonly number[]): Promise<void> {
  if (siteIds.length === 0) return
  const found = await db('sites').whereIn('id', [...siteIds]).select('id')
  const known = new Set(found.map((row: { id: number }) => row.id))
  const unknown = siteIds.find((id) => !known.has(id))
  if (unknown !== undefined) throw badRequest('siteIds', `${unknown} is not a site`)
}

export async function createStaff(trx: Db, actor: SessionUser, staff: StaffBody): Promise<StaffAccount> {
  await checkSites(trx, staff.siteIds)
  let id: number
  try {
    id = await insertUser(trx, { ...staff, passwordHash: await hashPassword(staff.password) })
  } catch (error) {
    if (isDuplicateKey(error)) throw conflict(`An account for ${staff.email} already exists.`, { field: 'email' })
    throw error
  }
  if (isProviderRole(staff.role)) {
    await insertProvider(trx, { userId: id, kind: staff.role, colour: DEFAULT_PROVIDER_COLOUR, capabilities: [] })
  }
  await writeAudit(trx, { userId: actor.id, action: 'staff_created', entity: 'user', entityId: id, after: { email: staff.email, role: staff.role } })
  return findStaff(trx, id)
}

export async function changeStaff(trx: Db, actor: SessionUser, id: number, patch: StaffPatch): Promise<StaffAccount> {
  const before = await findStaff(trx, id)
  if (id === actor.id && (patch.active === false || (patch.role !== undefined && patch.role !== before.role))) {
    throw badRequest(patch.active === false ? 'active' : 'role', 'you cannot deactivate your own account or change your own role')
  }
  if (patch.siteIds) await checkSites(trx, patch.siteIds)
  const allSites = patch.allSites ?? before.allSites
  const siteIds = patch.siteIds ?? before.siteIds
  if (!allSites && siteIds.length === 0) throw badRequest('siteIds', 'choose at least one site, or all sites')
  await updateUserProfile(trx, id, patch)
  if (patch.siteIds) await replaceUserSites(trx, id, patch.siteIds)
  // A new role or scope takes effect at once: the session guard reloads the user on every call.
  if (patch.active !== undefined && patch.active !== before.active) await setUserActive(trx, id, patch.active)
  const becomesProvider = patch.role !== undefined && isProviderRole(patch.role) && (await findProviderIdOfUser(trx, id)) === null
  if (becomesProvider) await insertProvider(trx, { userId: id, kind: patch.role as 'dentist' | 'hygienist', colour: DEFAULT_PROVIDER_COLOUR, capabilities: [] })
  await writeAudit(trx, { userId: actor.id, action: 'staff_changed', entity: 'user', entityId: id, before, after: patch })
  return findStaff(trx, id)
}

export async function resetPassword(trx: Db, actor: SessionUser, id: number, password: string): Promise<void> {
  if (!(await findUserById(trx, id))) throw notFound('No such staff account.')
  await setPasswordHash(trx, id, await hashPassword(password))
  await writeAudit(trx, { userId: actor.id, action: 'password_reset', entity: 'user', entityId: id })
}
