import { z } from 'zod'
import { MAX_ID } from '../domain/input-bounds'
import { instantInBounds } from './common'

const id = (what: string) => z.number({ error: `must be a ${what} id` }).int(`must be a ${what} id`).positive(`must be a ${what} id`).max(MAX_ID, `must be a ${what} id`)

/** POST /api/visits/:id/move-offers: the time proposed; chair and provider default to the visit's own. */
export const SendMoveOfferSchema = z.object({
  startUtc: z.string({ error: 'is required (the proposed start)' }).datetime({ offset: true, message: 'must be an ISO date-time such as 2027-01-11T17:00:00Z' }).superRefine(instantInBounds),
  operatoryId: id('chair').optional(),
  providerId: id('provider').optional(),
})
export type SendMoveOfferInput = z.infer<typeof SendMoveOfferSchema>
