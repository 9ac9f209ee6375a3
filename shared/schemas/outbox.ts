import { z } from 'zod'
import { IdSchema } from './common'
import { OUTBOX_STATES } from '../types/outbox'
import { CHANNELS } from '../domain/sms-channels'

export const OutboxQuerySchema = z.object({
  siteId: IdSchema.optional(),
  visitId: IdSchema.optional(),
  state: z.enum(OUTBOX_STATES, { error: `must be one of ${OUTBOX_STATES.join(', ')}` }).optional(),
  channel: z.enum(CHANNELS, { error: `must be one of ${CHANNELS.join(', ')}` }).optional(),
  limit: z.coerce.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be at least 1').max(500, 'must be at most 500').default(100),
})
export type OutboxQuery = z.infer<typeof OutboxQuerySchema>

export const VisitTokenQuerySchema = z.object({
  token: z.string({ error: 'is required' }).min(1, 'is required').max(200, 'is too long'),
})
