// Field schemas for site-local wall times and dates (the rota's own language), used by every
// rota, site and block schema so that each 400 reads the same way.
import { z } from 'zod'
import { IANAZone } from 'luxon'
import { validateRule } from '../domain/recurrence/rules'
import { dateInBounds } from './common'

const TIME_PATTERN = /^([01]\d|2[0-3]):[0-5]\d$/
const DATE_PATTERN = /^(\d{4})-(\d{2})-(\d{2})$/

/** A real calendar date: rejects 2026-02-30 as well as '2026-2-3'. */
export function isCalendarDate(value: string): boolean {
  const match = DATE_PATTERN.exec(value)
  if (!match) return false
  const [year, month, day] = [Number(match[1]), Number(match[2]), Number(match[3])]
  const probe = new Date(Date.UTC(year, month - 1, day))
  return probe.getUTCFullYear() === year && probe.getUTCMonth() === month - 1 && probe.getUTCDate() === day
}

export const LocalTimeSchema = z.string({ error: 'is required' }).regex(TIME_PATTERN, 'must be a time such as 07:30 (HH:mm, 24-hour)')

/** An end time may also be 24:00 (midnight at the end of the day). */
export const LocalEndTimeSchema = z
  .string({ error: 'is required' })
  .refine((value) => value === '24:00' || TIME_PATTERN.test(value), 'must be a time such as 16:00 (HH:mm, 24-hour)')

export const LocalDateSchema = z
  .string({ error: 'is required' })
  .regex(DATE_PATTERN, 'must be a date such as 2026-03-09 (YYYY-MM-DD)')
  .refine(isCalendarDate, 'is not a real calendar date')
  .superRefine(dateInBounds)

export const TimeZoneSchema = z
  .string({ error: 'is required' })
  .trim()
  .min(1, 'is required')
  .refine((zone) => IANAZone.isValidZone(zone), 'is not an IANA time zone such as America/Denver')

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

/** 'HH:mm' to minutes after midnight; '24:00' is 1440. */
export function minutesOf(time: string): number {
  const [hours, minutes] = time.split(':').map(Number)
  return (hours ?? 0) * 60 + (minutes ?? 0)
}

export interface TimeRangeFields {
  localStart?: string | null
  localEnd?: string | null
}

/** Shifts and blocks stay inside one day: an end at or before the start is a typing mistake here. */
export function endAfterStart(range: TimeRangeFields, ctx: z.RefinementCtx): void {
  if (!range.localStart || !range.localEnd) return
  if (minutesOf(range.localEnd) <= minutesOf(range.localStart)) {
    ctx.addIssue({ code: 'custom', path: ['localEnd'], message: 'must be after the start time' })
  }
}

export function dateNotBefore(later: string | null | undefined, earlier: string | null | undefined, field: string, ctx: z.RefinementCtx, what: string): void {
  if (later && earlier && later < earlier) ctx.addIssue({ code: 'custom', path: [field], message: `must not be before ${what}` })
}
