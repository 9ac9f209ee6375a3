// Creating and changing sites; a slug is made from the name when none is given.
import type { SessionUser } from '#shared/types/auth'
import type { SiteDetail } from '#shared/types/sites'
import type { SiteBody, SitePatch } from '#shared/schemas/sites'
import type { Db } from '../utils/db'
import { conflict, isDuplicateKey, notFound } from '../utils/errors'
import type { SiteSettingsBody } from '#shared/schemas/site-settings'
import { siteSettingsOf, type SiteSettings } from '#shared/domain/site-settings'
import { findSiteDetail, findStoredSettings, insertSite, updateSite, writeStoredSettings } from '../repositories/sites'
import { writeAudit } from '../repositories/audit-log'

export function slugOf(name: string): string {
  return name.toLowerCase().normalize('NFKD').replace(/[^a-z0-9]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'site'
}

function duplicateSlug(error: unknown, slug: string | undefined): never {
  if (isDuplicateKey(error)) throw conflict(`Another site already uses the short name "${slug}".`, { field: 'slug' })
  throw error
}

export async function createSite(trx: Db, actor: SessionUser, site: SiteBody): Promise<SiteDetail> {
  const slug = site.slug ?? slugOf(site.name)
  const id = await insertSite(trx, { ...site, slug }).catch((error: unknown) => duplicateSlug(error, slug))
  await writeAudit(trx, { userId: actor.id, action: 'site_created', entity: 'site', entityId: id, after: site })
  return (await findSiteDetail(trx, id))!
}

export async function changeSite(trx: Db, actor: SessionUser, id: number, patch: SitePatch): Promise<SiteDetail> {
  const before = await findSiteDetail(trx, id)
  if (!before) throw notFound('No such site.')
  await updateSite(trx, id, patch).catch((error: unknown) => duplicateSlug(error, patch.slug))
  await writeAudit(trx, { userId: actor.id, action: 'site_changed', entity: 'site', entityId: id, before, after: patch })
  return (await findSiteDetail(trx, id))!
}

export async function siteSettings(db: Db, id: number): Promise<SiteSettings> {
  const stored = await findStoredSettings(db, id)
  if (!stored) throw notFound('No such site.')
  return siteSettingsOf(stored)
}

/** Replaces the settings this form owns and keeps any other keys stored alongside them. */
export async function changeSiteSettings(trx: Db, actor: SessionUser, id: number, body: SiteSettingsBody): Promise<SiteSettings> {
  const stored = await findStoredSettings(trx, id, { forUpdate: true })
  if (!stored) throw notFound('No such site.')
  const before = siteSettingsOf(stored)
  await writeStoredSettings(trx, id, { ...stored, ...body })
  await writeAudit(trx, { userId: actor.id, action: 'site_settings_changed', entity: 'site', entityId: id, before, after: body })
  return siteSettingsOf({ ...stored, ...body })
}
