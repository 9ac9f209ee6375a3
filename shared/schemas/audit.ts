// GET /api/audit: the Audit screen's filters (issue 16 §4).
import { z } from 'zod'
import { IdSchema } from './common'
import { LocalDateSchema } from './local-time'

export const AUDIT_PAGE_SIZE = 50

export const AuditQuerySchema = z.object({
  userId: IdSchema.optional(),
  patientId: IdSchema.optional(),
  visitId: IdSchema.optional(),
  siteId: IdSchema.optional(),
  /** UTC calendar dates, both included. */
  from: LocalDateSchema.optional(),
  to: LocalDateSchema.optional(),
  action: z.string().trim().regex(/^[a-z_]{1,60}$/, 'must be an action name such as patient_changed').optional(),
  page: z.coerce.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be at least 1').max(10_000, 'must be at most 10000').default(1),
}).refine((query) => !query.from || !query.to || query.from <= query.to, { message: 'must not be before from', path: ['to'] })
export type AuditQuery = z.infer<typeof AuditQuerySchema>
