import { z } from 'zod'
import { IdSchema } from './common'
import { LocalDateSchema } from './local-time'
import { RECALL_KINDS } from '../domain/recall'
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
