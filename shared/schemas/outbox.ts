import { z } from 'zod'
import { IdSchema, plainText } from './common'
import { OUTBOX_STATES } from '../types/outbox'
import { CHANNELS } from '../domain/sms-channels'

/** The most messages one Outbox page returns; older ones come with `beforeId`. */
export const OUTBOX_PAGE_MAX = 500

export const OutboxQuerySchema = z.object({
  siteId: IdSchema.optional(),
  visitId: IdSchema.optional(),
  state: z.enum(OUTBOX_STATES, { error: `must be one of ${OUTBOX_STATES.join(', ')}` }).optional(),
  channel: z.enum(CHANNELS, { error: `must be one of ${CHANNELS.join(', ')}` }).optional(),
  /** A patient's name (each word starts a first or last name) or part of their e-mail address. */
  patient: plainText(z.string({ error: 'must be text' }).trim().min(2, 'type at least 2 characters').max(100, 'is too long')).optional(),
  /** Paging cursor: only messages older than this one (its id), newest first. */
  beforeId: IdSchema.optional(),
  limit: z.coerce.number({ error: 'must be a number' }).int('must be a whole number').min(1, 'must be at least 1').max(OUTBOX_PAGE_MAX, `must be at most ${OUTBOX_PAGE_MAX}`).default(100),
})
export type OutboxQuery = z.infer<typeof OutboxQuerySchema>

export const VisitTokenQuerySchema = z.object({
  token: z.string({ error: 'is required' }).min(1, 'is required').max(200, 'is too long'),
})

/** POST /api/visit/:token/cancel: the patient may say why (optional). */
export const PatientCancelSchema = z.object({
  reason: plainText(z.string({ error: 'must be text' }).trim().max(300, 'is too long')).optional(),
}).optional()
export type PatientCancelInput = z.infer<typeof PatientCancelSchema>
