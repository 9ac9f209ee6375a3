import { z } from 'zod'
import { CONTROL_CHARACTERS, dateBoundsProblem, instantBoundsProblem, MAX_ID } from '../domain/input-bounds'

export const IdSchema = z.coerce
  .number({ error: 'must be a number' })
  .int('must be a whole number')
  .positive('must be positive')
  .max(MAX_ID, `must be at most ${MAX_ID}`)

export const SiteQuerySchema = z.object({ siteId: IdSchema })

export const NO_CONTROL_CHARACTERS = 'must not contain line breaks or control characters'

/** Names, e-mails, reasons and notes: one line of text, no control characters (refused, not stripped). */
export function plainText<T extends z.ZodString>(schema: T): T {
  return schema.refine((value) => !CONTROL_CHARACTERS.test(value), NO_CONTROL_CHARACTERS) as T
}

/** A YYYY-MM-DD string inside DATE_BOUNDS (checked at parse time, so "today" moves with the clock). */
export function dateInBounds(value: string, ctx: z.RefinementCtx): void {
  const problem = dateBoundsProblem(value)
  if (problem) ctx.addIssue({ code: 'custom', message: problem })
}

/** An ISO instant whose UTC date is inside DATE_BOUNDS. */
export function instantInBounds(value: string, ctx: z.RefinementCtx): void {
  const problem = instantBoundsProblem(value)
  if (problem) ctx.addIssue({ code: 'custom', message: problem })
}
