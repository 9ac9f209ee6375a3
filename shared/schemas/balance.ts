// GET /api/balance: a range of local dates (each site's own), optionally one site, and the two
// thresholds a manager may set for "quiet" and "tight".
import { z } from 'zod'
import { IdSchema } from './common'
import { dateNotBefore, LocalDateSchema } from './local-time'
import { DEFAULT_BALANCE_THRESHOLDS } from '../domain/balance'

export const BALANCE_MAX_DAYS = 31

const share = z.coerce.number({ error: 'must be a number' }).min(0, 'must be between 0 and 1').max(1, 'must be between 0 and 1')

export const BalanceQuerySchema = z
  .object({
    from: LocalDateSchema,
    to: LocalDateSchema,
    siteId: IdSchema.optional(),
    quietBelow: share.default(DEFAULT_BALANCE_THRESHOLDS.quietBelow),
    tightFrom: share.default(DEFAULT_BALANCE_THRESHOLDS.tightFrom),
  })
  .superRefine((query, ctx) => {
    dateNotBefore(query.to, query.from, 'to', ctx, 'from')
    const days = (Date.parse(`${query.to}T00:00:00Z`) - Date.parse(`${query.from}T00:00:00Z`)) / 86_400_000 + 1
    if (days > BALANCE_MAX_DAYS) ctx.addIssue({ code: 'custom', path: ['to'], message: `must be at most ${BALANCE_MAX_DAYS} days from the first day` })
    if (query.quietBelow >= query.tightFrom) ctx.addIssue({ code: 'custom', path: ['quietBelow'], message: 'must be below tightFrom' })
  })
export type BalanceQuery = z.infer<typeof BalanceQuerySchema>

/**
 * POST /api/balance/rota-moves: Balance's rota move in one step, a provider's day moved from a quiet
 * site to a tight one (whole-day time off at `fromSiteId`, an extra day at `toSiteId` on the same
 * local date). `dryRun: true` previews what it strands; the hours at the receiving site are computed
 * by the server (`receivingHours`), never sent.
 */
export const RotaMoveSchema = z
  .object({
    providerId: IdSchema,
    date: LocalDateSchema,
    fromSiteId: IdSchema,
    toSiteId: IdSchema,
    dryRun: z.boolean({ error: 'must be true or false' }).optional(),
  })
  .superRefine((move, ctx) => {
    if (move.toSiteId === move.fromSiteId) ctx.addIssue({ code: 'custom', path: ['toSiteId'], message: 'must be another site than fromSiteId' })
  })
export type RotaMoveInput = z.infer<typeof RotaMoveSchema>
