// Creating and changing sites; a slug is made from the name when none is given.
import type { SessionUser } from '#shared/types/auth'
import type { OperatorySummary, SiteDetail } from '#shared/types/sites'
import type { OperatoryBody, OperatoryPatch, SiteBody, SitePatch } from '#shared/schemas/sites'
import type { Db } from '../utils/db'
import { inTransaction } from '../utils/db-retry'
import { requireSiteAccess } from '../utils/auth'
import { badRequest, conflict, isDuplicateKey, notFound } from '../utils/errors'
import { findOperatory, insertOperatory, updateOperatory } from '../repositories/operatories'
import type { SiteSettingsBody } from '#shared/schemas/site-settings'
import { siteSettingsOf, type SiteSettings } from '#shared/domain/site-settings'
import { findSite, findSiteDetail, findStoredSettings, insertSite, updateSite, writeStoredSettings } from '../repositories/sites'
import { writeAudit } from '../repositories/audit-log'
import { changeWithImpact, type ImpactResult } from './impact-service'

export function slugOf(name: string): string {
  return name.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'site'
}

function duplicateSlug(error: unknown, slug: string | undefined): never {
  if (isDuplicateKey(error)) throw conflict(`Another site already uses the short name "${slug}".`, { field: 'slug' })
  throw error
}

export function createSite(actor: SessionUser, site: SiteBody): Promise<SiteDetail> {
  return inTransaction(async (trx) => {
    const slug = site.slug ?? slugOf(site.name)
    const id = await insertSite(trx, { ...site, slug }).catch((error: unknown) => duplicateSlug(error, slug))
    await writeAudit(trx, { userId: actor.id, action: 'site_created', entity: 'site', entityId: id, after: site })
    return (await findSiteDetail(trx, id))!
  })
}

/** New opening hours or closed dates can strand booked visits: answered, and flagged on save. */
export function changeSite(actor: SessionUser, id: number, patch: SitePatch, dryRun = false): Promise<ImpactResult<SiteDetail>> {
  return changeWithImpact({ userId: actor.id, dryRun, cause: 'site hours or closed dates' }, async (trx, impact) => {
    const before = await findSiteDetail(trx, id)
    if (!before) throw notFound('No such site.')
    await impact.watch({ siteIds: [id] })
    await updateSite(trx, id, patch).catch((error: unknown) => duplicateSlug(error, patch.slug))
    await writeAudit(trx, { userId: actor.id, action: 'site_changed', entity: 'site', entityId: id, before, after: patch })
    return (await findSiteDetail(trx, id))!
  })
}

export async function siteSettings(db: Db, id: number): Promise<SiteSettings> {
  const stored = await findStoredSettings(db, id)
  if (!stored) throw notFound('No such site.')
  return siteSettingsOf(stored)
}

/** Replaces the settings this form owns and keeps any other keys stored alongside them. */
export function changeSiteSettings(actor: SessionUser, id: number, body: SiteSettingsBody): Promise<SiteSettings> {
  return inTransaction(async (trx) => {
    const stored = await findStoredSettings(trx, id, { forUpdate: true })
    if (!stored) throw notFound('No such site.')
    const before = siteSettingsOf(stored)
    await writeStoredSettings(trx, id, { ...stored, ...body })
    await writeAudit(trx, { userId: actor.id, action: 'site_settings_changed', entity: 'site', entityId: id, before, after: body })
    return siteSettingsOf({ ...stored, ...body })
  })
}

function duplicateRoom(error: unknown, name: string | undefined): never {
  if (isDuplicateKey(error)) throw conflict(`This site already has a room called "${name}".`, { field: 'name' })
  throw error
}

export function createOperatory(room: OperatoryBody): Promise<OperatorySummary> {
  return inTransaction(async (trx) => {
    if (!(await findSite(trx, room.siteId))) throw badRequest('siteId', 'is not a site')
    const id = await insertOperatory(trx, room).catch((error: unknown) => duplicateRoom(error, room.name))
    return (await findOperatory(trx, id))!
  })
}

/** Admins, and managers of the room's site (403 otherwise). Taking a room out of use or a capability away strands its visits. */
export function changeOperatory(actor: SessionUser, id: number, patch: OperatoryPatch, dryRun = false): Promise<ImpactResult<OperatorySummary>> {
  return changeWithImpact({ userId: actor.id, dryRun, cause: 'room changed' }, async (trx, impact) => {
    const room = await findOperatory(trx, id)
    if (!room) throw notFound('No such room.')
    requireSiteAccess(actor, room.siteId)
    await impact.watch({ siteIds: [room.siteId] })
    await updateOperatory(trx, id, patch).catch((error: unknown) => duplicateRoom(error, patch.name))
    return (await findOperatory(trx, id))!
  })
}
