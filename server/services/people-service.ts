// Staff accounts: create (with a provider row for dentists and hygienists), change, deactivate,
// reset password. Deactivation and password resets bump session_version, ending old sessions.
// A provider's kind is the account's role (no copy on the provider row). When the role stops being a
// provider role, the provider row is deactivated, or the change is refused (409) while the provider
// still has open visits ahead; when it becomes a provider role again, the row is reactivated.
import { formatDateTime } from '#shared/utils/display-time'
import type { SessionUser } from '#shared/types/auth'
import type { ProviderSummary, StaffAccount } from '#shared/types/people'
import type { ProviderBody, ProviderPatch, StaffBody, StaffPatch } from '#shared/schemas/people'
import { isProviderRole } from '#shared/utils/access'
import type { Db } from '../utils/db'
import { inTransaction } from '../utils/db-retry'
import { badRequest, conflict, isDuplicateKey, notFound } from '../utils/errors'
import {
  findUserById, insertUser, listStaffRows, replaceUserSites, setPasswordHash, setUserActive, siteIdsByUser,
  toSessionUser, updateUserProfile, type StaffRow,
} from '../repositories/users'
import { findProvider, findProviderIdOfUser, insertProvider, lockProvider, updateProvider } from '../repositories/providers'
import { openVisitsOfProvider, type OpenVisitRow } from '../repositories/visits'
import { scheduleNowMs } from '../utils/clock'
import { existingSiteIds } from '../repositories/sites'
import { writeAudit } from '../repositories/audit-log'
import { changeWithImpact, type ImpactResult } from './impact-service'

const DEFAULT_PROVIDER_COLOUR = '#2563eb'

function toAccount(row: StaffRow, siteIds: number[]): StaffAccount {
  return {
    ...toSessionUser(row, siteIds),
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
  const known = await existingSiteIds(db, siteIds)
  const unknown = siteIds.find((id) => !known.has(id))
  if (unknown !== undefined) throw badRequest('siteIds', `${unknown} is not a site`)
}

export function createStaff(actor: SessionUser, staff: StaffBody): Promise<StaffAccount> {
  return inTransaction(async (trx) => {
    await checkSites(trx, staff.siteIds)
    let id: number
    try {
      id = await insertUser(trx, { ...staff, passwordHash: await hashPassword(staff.password) })
    } catch (error) {
      if (isDuplicateKey(error)) throw conflict(`An account for ${staff.email} already exists.`, { field: 'email' })
      throw error
    }
    if (isProviderRole(staff.role)) {
      await insertProvider(trx, { userId: id, colour: DEFAULT_PROVIDER_COLOUR, capabilities: [] })
    }
    await writeAudit(trx, { userId: actor.id, action: 'staff_created', entity: 'user', entityId: id, after: { email: staff.email, role: staff.role } })
    return findStaff(trx, id)
  })
}

/** Deactivating a dentist or hygienist strands their open visits ahead: answered, and flagged on save. */
export function changeStaff(actor: SessionUser, id: number, patch: StaffPatch, dryRun = false): Promise<ImpactResult<StaffAccount>> {
  return changeWithImpact({ userId: actor.id, dryRun, cause: 'person deactivated' }, async (trx, impact) => {
    const before = await findStaff(trx, id)
    if (id === actor.id && (patch.active === false || (patch.role !== undefined && patch.role !== before.role))) {
      throw badRequest(patch.active === false ? 'active' : 'role', 'you cannot deactivate your own account or change your own role')
    }
    if (patch.active === false && before.providerId !== null) {
      // The provider row is what bookings lock: one in flight finishes first and is then checked here.
      await lockProvider(trx, before.providerId)
      await impact.watch({ providerId: before.providerId })
    }
    if (patch.siteIds) await checkSites(trx, patch.siteIds)
    const allSites = patch.allSites ?? before.allSites
    const siteIds = patch.siteIds ?? before.siteIds
    if (!allSites && siteIds.length === 0) throw badRequest('siteIds', 'choose at least one site, or all sites')
    await updateUserProfile(trx, id, patch)
    if (patch.siteIds) await replaceUserSites(trx, id, patch.siteIds)
    // A new role or scope takes effect at once: the session guard reloads the user on every call.
    if (patch.active !== undefined && patch.active !== before.active) await setUserActive(trx, id, patch.active)
    if (patch.role !== undefined) await followRole(trx, id, before, patch.role)
    await writeAudit(trx, { userId: actor.id, action: 'staff_changed', entity: 'user', entityId: id, before, after: patch })
    return findStaff(trx, id)
  })
}

const NAMED_VISITS = 5

function describeVisits(visits: OpenVisitRow[]): string {
  const named = visits.slice(0, NAMED_VISITS).map((visit) =>
    `${formatDateTime(visit.start_utc, { timeZone: visit.time_zone, clock: visit.clock, dateOrder: visit.date_order }, 'medium')} at ${visit.site_name} (visit ${visit.id})`)
  const more = visits.length > NAMED_VISITS ? ` and ${visits.length - NAMED_VISITS} more` : ''
  return `${named.join(', ')}${more}`
}

/** Keeps the provider row in step with a role change (the role is the provider's kind). */
async function followRole(trx: Db, userId: number, before: StaffAccount, role: StaffAccount['role']): Promise<void> {
  const wasProvider = isProviderRole(before.role)
  const willBeProvider = isProviderRole(role)
  const providerId = await findProviderIdOfUser(trx, userId)
  if (wasProvider && !willBeProvider && providerId !== null) {
    const visits = await openVisitsOfProvider(trx, providerId, scheduleNowMs())
    if (visits.length > 0) {
      throw conflict(
        `${before.name} still has ${visits.length} open visit${visits.length === 1 ? '' : 's'} as a provider: ${describeVisits(visits)}. `
        + 'Give them to another provider or cancel them before changing the role.',
        { field: 'role', visitIds: visits.map((visit) => visit.id) },
      )
    }
    await updateProvider(trx, providerId, { active: false })
  } else if (!wasProvider && willBeProvider) {
    if (providerId === null) await insertProvider(trx, { userId, colour: DEFAULT_PROVIDER_COLOUR, capabilities: [] })
    else await updateProvider(trx, providerId, { active: true })
  }
}

export function resetPassword(actor: SessionUser, id: number, password: string): Promise<void> {
  return inTransaction(async (trx) => {
    if (!(await findUserById(trx, id))) throw notFound('No such staff account.')
    await setPasswordHash(trx, id, await hashPassword(password))
    await writeAudit(trx, { userId: actor.id, action: 'password_reset', entity: 'user', entityId: id })
  })
}

/** An existing staff account becomes a provider. */
export function createProvider(provider: ProviderBody): Promise<ProviderSummary> {
  return inTransaction(async (trx) => {
    const user = await findUserById(trx, provider.userId)
    if (!user) throw badRequest('userId', 'is not a staff account')
    if (!isProviderRole(user.role)) throw badRequest('userId', 'is not a dentist or hygienist: change the role on People first')
    if ((await findProviderIdOfUser(trx, provider.userId)) !== null) throw conflict('This person is already a provider.', { field: 'userId' })
    const id = await insertProvider(trx, provider)
    return (await findProvider(trx, id))!
  })
}

/** Deactivating a provider or taking a category away strands their open visits ahead. */
export function changeProvider(actor: SessionUser, id: number, patch: ProviderPatch, dryRun = false): Promise<ImpactResult<ProviderSummary>> {
  return changeWithImpact({ userId: actor.id, dryRun, cause: 'provider changed' }, async (trx, impact) => {
    if (!(await findProvider(trx, id))) throw notFound('No such provider.')
    await impact.watch({ providerId: id })
    await updateProvider(trx, id, patch)
    return (await findProvider(trx, id))!
  })
}
