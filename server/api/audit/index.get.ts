// GET /api/audit?userId&patientId&visitId&siteId&from&to&action&page: the audit log for managers and
// admins, newest first, 50 a page. Filtering by a site the caller does not cover is a 403.
import { AUDIT_PAGE_SIZE, AuditQuerySchema } from '#shared/schemas/audit'
import type { AuditPage } from '#shared/types/audit'
import { addDays } from '#shared/utils/local-date'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { validateWith } from '../../utils/errors'
import { listAudit } from '../../repositories/audit-log'

export default defineEventHandler(async (event): Promise<AuditPage> => {
  const user = requireRole(event, MANAGING_ROLES)
  const query = await getValidatedQuery(event, validateWith(AuditQuerySchema))
  if (query.siteId !== undefined) requireSiteAccess(user, query.siteId)
  const { rows, total } = await listAudit(useDb(), {
    ...query,
    fromUtc: query.from ? new Date(`${query.from}T00:00:00Z`) : undefined,
    toUtc: query.to ? new Date(`${addDays(query.to, 1)}T00:00:00Z`) : undefined,
  }, query.page, AUDIT_PAGE_SIZE)
  return { entries: rows, total, page: query.page, pageSize: AUDIT_PAGE_SIZE }
})
