import { z } from 'zod'
import { IdSchema, instantInBounds } from './common'
import { LocalDateSchema } from './local-time'
import { RECALL_KINDS, RECALL_MONTHS_MAX, RECALL_MONTHS_MIN } from '../domain/recall'
import { MAX_ID } from '../domain/input-bounds'

export const RecallListQuerySchema = z.object({
  siteId: IdSchema,
  /** Due on or before this local date (default: 30 days from today at the site). */
  to: LocalDateSchema.optional(),
  kind: z.enum(RECALL_KINDS, { error: `must be one of ${RECALL_KINDS.join(', ')}` }).optional(),
})

export const RecallMailSchema = z.object({
  siteId: z.number({ error: 'must be a site id' }).int('must be a site id').positive('must be a site id').max(MAX_ID, 'must be a site id'),
  recallIds: z.array(z.number({ error: 'must be a recall id' }).int('must be a recall id').positive('must be a recall id').max(MAX_ID, 'must be a recall id'), { error: 'must be a list of recalls' })
    .min(1, 'choose at least one patient').max(200, 'at most 200 at once'),
  /** Only show the message; send nothing. */
  preview: z.boolean({ error: 'must be true or false' }).default(false),
})
export type RecallMailInput = z.infer<typeof RecallMailSchema>

/** The patient picks one of the recall page's times (the chair and provider it was offered with). */
export const RecallBookSchema = z.object({
  startUtc: z.string({ error: 'is required' }).datetime({ offset: true, message: 'must be an ISO date-time such as 2027-01-11T17:00:00Z' }).superRefine(instantInBounds),
  operatoryId: z.number({ error: 'must be a chair id' }).int('must be a chair id').positive('must be a chair id').max(MAX_ID, 'must be a chair id'),
  providerId: z.number({ error: 'must be a provider id' }).int('must be a provider id').positive('must be a provider id').max(MAX_ID, 'must be a provider id'),
})
export type RecallBookInput = z.infer<typeof RecallBookSchema>

const months = z.number({ error: `must be a whole number of months (${RECALL_MONTHS_MIN} to ${RECALL_MONTHS_MAX}), or empty for the site's default` })
  .int(`must be a whole number of months (${RECALL_MONTHS_MIN} to ${RECALL_MONTHS_MAX})`)
  .min(RECALL_MONTHS_MIN, `must be at least ${RECALL_MONTHS_MIN} month`)
  .max(RECALL_MONTHS_MAX, `must be at most ${RECALL_MONTHS_MAX} months`)
  .nullable()

/**
 * A patient's own recall interval per kind, in months; null goes back to the site's default.
 * Used by the patient page's form and by PUT /api/patients/:id/recall-intervals alike.
 */
export const RecallIntervalsSchema = z.object({
  cleaning: months,
  exam: months,
}, { error: 'must give cleaning and exam (months, or null for the site default)' }).strict()
export type RecallIntervalsInput = z.infer<typeof RecallIntervalsSchema>
