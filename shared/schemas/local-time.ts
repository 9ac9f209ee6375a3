// Field schemas for site-local wall times and dates (the rota's own language), used by every
// rota, site and block schema so that each 400 reads the same way.
import { z } from 'zod'
import { validateRule } from '../domain/recurrence/rules'
import { isKnownZone, minutesOfDayOrNull } from '../utils/local-date'
import { dateInBounds } from './common'

/** 'HH:mm', 00:00 to 23:59 (zod's ISO time without seconds). */
const TimeOfDay = z.iso.time({ precision: -1 })
const DATE_SHAPE = /^\d{4}-\d{2}-\d{2}$/

/**
 * A real calendar date 'YYYY-MM-DD' (zod's ISO date, so 2026-02-30 is refused). Its messages say
 * which is wrong: the shape (`shapeMessage`) or a date that does not exist.
 */
export function calendarDate(shapeMessage: string) {
  return z.iso.date({
    error: (issue) => {
      if (issue.code === 'invalid_type') return 'is required'
      return typeof issue.input === 'string' && DATE_SHAPE.test(issue.input) ? 'is not a real calendar date' : shapeMessage
    },
  })
}

export const LocalTimeSchema = z.iso.time({
  precision: -1,
  error: (issue) => (issue.code === 'invalid_type' ? 'is required' : 'must be a time such as 07:30 (HH:mm, 24-hour)'),
})

/** An end time may also be 24:00 (midnight at the end of the day). */
export const LocalEndTimeSchema = z
  .string({ error: 'is required' })
  .refine((value) => value === '24:00' || TimeOfDay.safeParse(value).success, 'must be a time such as 16:00 (HH:mm, 24-hour)')

export const LocalDateSchema = calendarDate('must be a date such as 2026-03-09 (YYYY-MM-DD)').superRefine(dateInBounds)

export const TimeZoneSchema = z
  .string({ error: 'is required' })
  .trim()
  .min(1, 'is required')
  .refine(isKnownZone, 'is not an IANA time zone such as America/Denver')

/** An RRULE value without DTSTART/UNTIL, checked by the recurrence engine. */
export const RruleSchema = z
  .string({ error: 'is required' })
  .trim()
  .min(1, 'is required')
  .max(500, 'is too long')
  .superRefine((rule, ctx) => {
    const reason = validateRule(rule)
    if (reason) ctx.addIssue({ code: 'custom', message: reason })
  })

export const ColourSchema = z.string({ error: 'is required' }).regex(/^#[0-9a-fA-F]{6}$/, 'must be a colour such as #0f766e')

export interface TimeRangeFields {
  localStart?: string | null
  localEnd?: string | null
}

/** Shifts and blocks stay inside one day: an end at or before the start is a typing mistake here. */
export function endAfterStart(range: TimeRangeFields, ctx: z.RefinementCtx): void {
  if (!range.localStart || !range.localEnd) return
  const start = minutesOfDayOrNull(range.localStart)
  const end = minutesOfDayOrNull(range.localEnd)
  // A malformed time has its own 400 from its field's schema.
  if (start !== null && end !== null && end <= start) {
    ctx.addIssue({ code: 'custom', path: ['localEnd'], message: 'must be after the start time' })
  }
}

export function dateNotBefore(later: string | null | undefined, earlier: string | null | undefined, field: string, ctx: z.RefinementCtx, what: string): void {
  if (later && earlier && later < earlier) ctx.addIssue({ code: 'custom', path: [field], message: `must not be before ${what}` })
}
