import { z } from 'zod'
import { IdSchema, plainText } from './common'

/** A front desk's own text to the patient of a visit. */
export const FreeTextSchema = z.object({
  body: plainText(z.string({ error: 'is required' }).trim().min(1, 'is required').max(320, 'must be at most 320 characters')),
})
export type FreeText = z.infer<typeof FreeTextSchema>

export const UnansweredQuerySchema = z.object({
  siteId: IdSchema.optional(),
})
