// What the Sites & rooms screen sends: a site with its calendar, and its operatories.
import { z } from 'zod'
import { OPERATORY_CAPABILITIES } from '../types/chair-time'
import { DEFAULT_LATE_AFTER_MINUTES, MAX_LATE_AFTER_MINUTES } from '../domain/late'
import { CLOCK_STYLES, DATE_ORDERS } from '../types/display'
import { IdSchema, plainText } from './common'
import { ColourSchema, LocalDateSchema, LocalEndTimeSchema, LocalTimeSchema, TimeZoneSchema } from './local-time'
import { minutesOfDayOrNull } from '../utils/local-date'

export const BOOKING_UNITS = [5, 10, 15] as const

const openingRange = z
  .object({ start: LocalTimeSchema, end: LocalEndTimeSchema })
  .refine((range) => (minutesOfDayOrNull(range.end) ?? Infinity) > (minutesOfDayOrNull(range.start) ?? -Infinity), { path: ['end'], message: 'must be after the opening time' })

const dayHours = z.array(openingRange, { error: 'must be a list of opening ranges' }).max(4, 'has too many ranges')

export const OpeningHoursSchema = z.object({
  '1': dayHours, '2': dayHours, '3': dayHours, '4': dayHours, '5': dayHours, '6': dayHours, '7': dayHours,
}, { error: 'must list every weekday 1 (Monday) to 7 (Sunday)' })

const optionalText = (max: number) => plainText(z.string({ error: 'must be text' }).trim().max(max, 'is too long'))

const siteFields = {
  name: plainText(z.string({ error: 'is required' }).trim().min(1, 'is required').max(120, 'is too long')),
  slug: z.string({ error: 'must be text' }).trim().toLowerCase().regex(/^[a-z0-9]+(-[a-z0-9]+)*$/, 'use lower-case letters, digits and dashes').max(60, 'is too long'),
  timeZone: TimeZoneSchema,
  address: optionalText(300),
  phone: optionalText(40),
  email: z.union([z.literal(''), plainText(z.string().trim().max(254, 'is too long').email('is not an e-mail address'))], { error: 'is not an e-mail address' }),
  colour: ColourSchema,
  bookingUnitMinutes: z.number({ error: 'must be a number' }).refine((unit) => (BOOKING_UNITS as readonly number[]).includes(unit), 'must be 5, 10 or 15 minutes'),
  toothNotation: z.enum(['universal', 'iso'], { error: 'must be universal or iso' }),
  lateAfterMinutes: z.number({ error: 'must be a number of minutes' }).int('must be whole minutes').min(0, 'cannot be negative').max(MAX_LATE_AFTER_MINUTES, `must be at most ${MAX_LATE_AFTER_MINUTES} minutes`),
  clock: z.enum(CLOCK_STYLES, { error: 'must be 12h or 24h' }),
  dateOrder: z.enum(DATE_ORDERS, { error: `must be one of ${DATE_ORDERS.join(', ')}` }),
  openingHours: OpeningHoursSchema,
  closedDates: z.array(LocalDateSchema, { error: 'must be a list of dates' }).max(400, 'has too many dates'),
  active: z.boolean({ error: 'must be yes or no' }),
}

export const SiteSchema = z.object({
  ...siteFields,
  slug: siteFields.slug.optional(),
  address: siteFields.address.default(''),
  phone: siteFields.phone.default(''),
  email: siteFields.email.default(''),
  colour: siteFields.colour.default('#4b5563'),
  bookingUnitMinutes: siteFields.bookingUnitMinutes.default(5),
  toothNotation: siteFields.toothNotation.default('universal'),
  lateAfterMinutes: siteFields.lateAfterMinutes.default(DEFAULT_LATE_AFTER_MINUTES),
  clock: siteFields.clock.default('12h'),
  dateOrder: siteFields.dateOrder.default('month-day-year'),
  closedDates: siteFields.closedDates.default([]),
  active: siteFields.active.default(true),
})
export type SiteBody = z.infer<typeof SiteSchema>

export const SitePatchSchema = z.object(siteFields).partial()
export type SitePatch = z.infer<typeof SitePatchSchema>

const operatoryFields = {
  name: plainText(z.string({ error: 'is required' }).trim().min(1, 'is required').max(80, 'is too long')),
  capabilities: z.array(z.enum(OPERATORY_CAPABILITIES, { error: `must be one of ${OPERATORY_CAPABILITIES.join(', ')}` }), { error: 'must be a list' }),
  active: z.boolean({ error: 'must be yes or no' }),
  sortOrder: z.number({ error: 'must be a number' }).int('must be a whole number').min(0, 'must be 0 or more').max(999, 'must be at most 999'),
}

export const OperatorySchema = z.object({
  siteId: IdSchema,
  ...operatoryFields,
  active: operatoryFields.active.default(true),
  sortOrder: operatoryFields.sortOrder.optional(),
})
export type OperatoryBody = z.infer<typeof OperatorySchema>

export const OperatoryPatchSchema = z.object(operatoryFields).partial()
export type OperatoryPatch = z.infer<typeof OperatoryPatchSchema>
