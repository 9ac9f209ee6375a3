// What the Rota screen sends: shifts, exceptions (time off, extra days) and blocks.
import { z } from 'zod'
import { IdSchema, plainText } from './common'
import { inclusiveDays, MAX_WINDOW_DAYS } from '../domain/input-bounds'
import { dateNotBefore, endAfterStart, LocalDateSchema, LocalEndTimeSchema, LocalTimeSchema, RruleSchema } from './local-time'

const note = plainText(z.string({ error: 'must be text' }).trim().max(200, 'is too long'))
const reasonRequired = plainText(z.string({ error: 'is required' }).trim().min(1, 'is required').max(200, 'is too long'))
const optionalId = IdSchema.nullable().optional().transform((value) => value ?? null)

const shiftFields = {
  providerId: IdSchema,
  siteId: IdSchema,
  rrule: RruleSchema,
  validFrom: LocalDateSchema,
  validUntil: LocalDateSchema.nullable().optional().transform((value) => value ?? null),
  localStart: LocalTimeSchema,
  localEnd: LocalEndTimeSchema,
  note: note.optional().transform((value) => value ?? ''),
}

export const ShiftSchema = z.object(shiftFields).superRefine((shift, ctx) => {
  endAfterStart(shift, ctx)
  dateNotBefore(shift.validUntil, shift.validFrom, 'validUntil', ctx, 'the first day (validFrom)')
})
export type ShiftBody = z.infer<typeof ShiftSchema>

/** A PATCH names only what changes; the merged shift is checked again with ShiftSchema. */
export const ShiftPatchSchema = z.object({
  providerId: IdSchema.optional(),
  siteId: IdSchema.optional(),
  rrule: RruleSchema.optional(),
  validFrom: LocalDateSchema.optional(),
  validUntil: LocalDateSchema.nullable().optional(),
  localStart: LocalTimeSchema.optional(),
  localEnd: LocalEndTimeSchema.optional(),
  note: note.optional(),
})
export type ShiftPatch = z.infer<typeof ShiftPatchSchema>

export const ShiftExceptionSchema = z
  .object({
    providerId: IdSchema,
    kind: z.enum(['time_off', 'extra'], { error: 'must be time_off or extra' }),
    siteId: optionalId,
    startDate: LocalDateSchema,
    endDate: LocalDateSchema,
    localStart: LocalTimeSchema.nullable().optional().transform((value) => value ?? null),
    localEnd: LocalEndTimeSchema.nullable().optional().transform((value) => value ?? null),
    reason: note.optional().transform((value) => value ?? ''),
  })
  .superRefine((exception, ctx) => {
    if (exception.kind === 'extra' && exception.siteId === null) {
      ctx.addIssue({ code: 'custom', path: ['siteId'], message: 'is required for an extra shift (where the provider works)' })
    }
    if ((exception.localStart === null) !== (exception.localEnd === null)) {
      ctx.addIssue({ code: 'custom', path: [exception.localStart === null ? 'localStart' : 'localEnd'], message: 'give both times, or neither for the whole day' })
    }
    endAfterStart(exception, ctx)
    dateNotBefore(exception.endDate, exception.startDate, 'endDate', ctx, 'the start date')
  })
export type ShiftExceptionBody = z.infer<typeof ShiftExceptionSchema>

const blockFields = {
  siteId: IdSchema,
  operatoryId: optionalId,
  providerId: optionalId,
  startDate: LocalDateSchema,
  localStart: LocalTimeSchema,
  localEnd: LocalEndTimeSchema,
  rrule: RruleSchema.nullable().optional().transform((value) => value ?? null),
  untilDate: LocalDateSchema.nullable().optional().transform((value) => value ?? null),
  reason: reasonRequired,
}

export const BlockSchema = z
  .object(blockFields)
  .superRefine((block, ctx) => {
    endAfterStart(block, ctx)
    dateNotBefore(block.untilDate, block.startDate, 'untilDate', ctx, 'the first day (startDate)')
    if (block.rrule === null && block.untilDate !== null) {
      ctx.addIssue({ code: 'custom', path: ['untilDate'], message: 'only applies to a recurring block' })
    }
  })
export type BlockBody = z.infer<typeof BlockSchema>

export const BlockPatchSchema = z.object(blockFields).partial()
export type BlockPatch = z.infer<typeof BlockPatchSchema>

/** A window of at most MAX_WINDOW_DAYS local days, both included, `to` not before `from`. */
function windowWithinLimit(query: { from: string, to: string }, ctx: z.RefinementCtx): void {
  const days = inclusiveDays(query.from, query.to)
  if (Number.isNaN(days)) return
  if (days < 1) ctx.addIssue({ code: 'custom', path: ['to'], message: 'must not be before from' })
  else if (days > MAX_WINDOW_DAYS) ctx.addIssue({ code: 'custom', path: ['to'], message: `must be at most ${MAX_WINDOW_DAYS} days after from` })
}

/** `from` and `to` are the site's local dates, both included (the naming table's local-date range). */
export const AvailabilityQuerySchema = z.object({ siteId: IdSchema, from: LocalDateSchema, to: LocalDateSchema }).superRefine(windowWithinLimit)
export type AvailabilityQuery = z.infer<typeof AvailabilityQuerySchema>

export const RotaQuerySchema = z
  .object({
    siteId: IdSchema.optional(),
    providerId: IdSchema.optional(),
    from: LocalDateSchema,
    to: LocalDateSchema,
  })
  .superRefine((query, ctx) => {
    if ((query.siteId === undefined) === (query.providerId === undefined)) {
      ctx.addIssue({ code: 'custom', path: ['siteId'], message: 'give either siteId or providerId' })
    }
    windowWithinLimit(query, ctx)
  })
export type RotaQuery = z.infer<typeof RotaQuerySchema>

export const RotaListQuerySchema = z.object({ siteId: IdSchema.optional(), providerId: IdSchema.optional() })
export type RotaListQuery = z.infer<typeof RotaListQuerySchema>
