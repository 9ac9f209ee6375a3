// GET /api/audit?userId&patientId&visitId&siteId&from&to&action&page: the audit log for managers and
// admins, newest first, 50 a page. Filtering by a site the caller does not cover is a 403. A manager of
// some sites only sees one of their sites at a time (their only site when they have one; otherwise a
// 400 asks which), never the group's other sites or its group-wide entries.
import { AUDIT_PAGE_SIZE, AuditQuerySchema } from '#shared/schemas/audit'
import type { AuditPage } from '#shared/types/audit'
import { addDays } from '#shared/utils/local-date'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { badRequest, validateWith } from '../../utils/errors'
import { listAudit } from '../../repositories/audit-log'

export default defineEventHandler(async (event): Promise<AuditPage> => {
  const user = requireRole(event, MANAGING_ROLES)
  const query = await getValidatedQuery(event, validateWith(AuditQuerySchema))
  const siteId = query.siteId ?? (!user.allSites && user.siteIds.length === 1 ? user.siteIds[0] : undefined)
  if (!user.allSites && siteId === undefined) throw badRequest('siteId', 'choose one of your sites')
  if (siteId !== undefined) requireSiteAccess(user, siteId)
  const { rows, total } = await listAudit(useDb(), {
    ...query,
    siteId,
    fromUtc: query.from ? new Date(`${query.from}T00:00:00Z`) : undefined,
    toUtc: query.to ? new Date(`${addDays(query.to, 1)}T00:00:00Z`) : undefined,
  }, query.page, AUDIT_PAGE_SIZE)
  return { entries: rows, total, page: query.page, pageSize: AUDIT_PAGE_SIZE }
})
