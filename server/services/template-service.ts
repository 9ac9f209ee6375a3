// Chair-time templates: create, revise (new version), deactivate; and the chair-time calculation.
import type { SessionUser } from '#shared/types/auth'
import type { ChairTimeTemplate, BookingUnitMinutes, VisitPlan } from '#shared/types/chair-time'
import type { StoredTemplate } from '#shared/types/templates'
import type { ChairTimeRequest, TemplateInput } from '#shared/schemas/templates'
import { validateTemplate } from '#shared/domain/template-validation'
import { canEditGroupWide } from '#shared/utils/access'
import { useDb, type Db } from '../utils/db'
import { inTransaction } from '../utils/db-retry'
import { badRequest, conflict, notFound } from '../utils/errors'
import { requireSiteAccess } from '../utils/auth'
import { findSite } from '../repositories/sites'
import { writeAudit } from '../repositories/audit-log'
import {
  codeExists, findTemplateById, insertFirstVersion, insertNextVersion, setCodeActive,
} from '../repositories/templates'
import { planItems } from './plan-service'
import { changeWithImpact, type ImpactResult } from './impact-service'
import { lockSites } from '../repositories/stranded'

function assertValid(template: ChairTimeTemplate): void {
  const issues = validateTemplate(template)
  const first = issues[0]
  if (first) throw badRequest(first.field, first.reason, issues)
}

/** Templates are used by every site: kept by admins and managers of all sites. */
function requireGroupWide(user: SessionUser): void {
  if (!canEditGroupWide(user)) {
    throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'Templates are shared by every site: only admins and managers of all sites may change them.' })
  }
}

async function existingTemplate(db: Db, id: number): Promise<StoredTemplate> {
  const template = await findTemplateById(db, id)
  if (!template) throw notFound('No such template.')
  return template
}

export async function createTemplate(input: TemplateInput, user: SessionUser): Promise<StoredTemplate> {
  requireGroupWide(user)
  assertValid(input)
  return inTransaction(async (trx) => {
    if (await codeExists(trx, input.code)) {
      throw conflict(`A template with code ${input.code} already exists. Edit it to save a new version.`, { field: 'code' })
    }
    const id = await insertFirstVersion(trx, input, user.id)
    await writeAudit(trx, { userId: user.id, action: 'template_created', entity: 'procedure_template', entityId: id, after: input })
    return existingTemplate(trx, id)
  })
}

/**
 * An edit never changes a version in place: booked visits keep the plan they were booked with. A new
 * room capability or category does apply to them, though (a visit needing a surgery room cannot stay
 * in a hygiene room): those it strands are answered, and flagged on save.
 */
export async function reviseTemplate(id: number, input: TemplateInput, user: SessionUser, dryRun = false): Promise<ImpactResult<StoredTemplate>> {
  requireGroupWide(user)
  assertValid(input)
  return changeWithImpact({ userId: user.id, dryRun, cause: 'template changed' }, async (trx, impact) => {
    const before = await existingTemplate(trx, id)
    if (input.code !== before.code) throw badRequest('code', `cannot change; this template's code is ${before.code}`)
    if (input.capability !== before.capability || input.category !== before.category) {
      // Bookings read no template row under lock; they read their site's row in share mode.
      await lockSites(trx)
      await impact.watch({ templateCode: before.code })
    }
    const newId = await insertNextVersion(trx, before.code, input, user.id)
    await writeAudit(trx, { userId: user.id, action: 'template_revised', entity: 'procedure_template', entityId: newId, before, after: input })
    return existingTemplate(trx, newId)
  })
}

export async function deactivateTemplate(id: number, user: SessionUser): Promise<StoredTemplate> {
  requireGroupWide(user)
  return inTransaction(async (trx) => {
    const template = await existingTemplate(trx, id)
    await setCodeActive(trx, template.code, false)
    await writeAudit(trx, { userId: user.id, action: 'template_deactivated', entity: 'procedure_template', entityId: id })
    return existingTemplate(trx, id)
  })
}

async function bookingUnitFor(user: SessionUser, siteId: number | undefined): Promise<BookingUnitMinutes> {
  if (siteId === undefined) return 5
  requireSiteAccess(user, siteId)
  const site = await findSite(useDb(), siteId)
  if (!site) throw badRequest('siteId', 'no such site')
  return site.bookingUnitMinutes as BookingUnitMinutes
}

/** Resolves the request's templates and runs the pure engine; domain errors become 400s. */
export async function computeChairTime(request: ChairTimeRequest, user: SessionUser): Promise<VisitPlan> {
  const unitMinutes = await bookingUnitFor(user, request.siteId)
  return (await planItems(useDb(), request.items, unitMinutes)).plan
}
