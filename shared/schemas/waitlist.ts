import { z } from 'zod'
import { ChairTimeItemSchema } from './templates'
import { IdSchema, instantInBounds, plainText } from './common'
import { LocalDateSchema } from './local-time'
import { inclusiveDays, MAX_ID } from '../domain/input-bounds'

const id = (what: string) => z.number({ error: `must be a ${what} id` }).int(`must be a ${what} id`).positive(`must be a ${what} id`).max(MAX_ID, `must be a ${what} id`)
const utcInstant = z.string({ error: 'is required' }).datetime({ offset: true, message: 'must be an ISO date-time such as 2027-01-11T17:00:00Z' }).superRefine(instantInBounds)

/** A waitlist entry can wait at most this many days ahead. */
export const WAITLIST_MAX_DAYS = 180

export const NewWaitlistEntrySchema = z.object({
  patientId: id('patient'),
  siteId: id('site'),
  /** Sites the patient accepts; the entry's own site when left out. */
  siteIds: z.array(id('site'), { error: 'must be a list of sites' }).min(1, 'choose at least one site').max(20, 'at most 20 sites').optional(),
  items: z.array(ChairTimeItemSchema, { error: 'must be a list of procedures' }).min(1, 'add at least one procedure').max(8, 'at most 8 procedures in one visit'),
  from: LocalDateSchema,
  to: LocalDateSchema,
  partOfDay: z.enum(['morning', 'afternoon', 'any'], { error: 'must be morning, afternoon or any' }).default('any'),
  noticeMinutes: z.number({ error: 'must be a number of minutes' }).int('must be whole minutes').min(0, 'cannot be negative').max(14 * 24 * 60, 'must be at most 14 days').default(120),
  priority: z.number({ error: 'must be 1 to 5' }).int('must be 1 to 5').min(1, 'must be 1 to 5').max(5, 'must be 1 to 5').default(3),
  note: plainText(z.string({ error: 'must be text' }).max(500, 'is too long')).default(''),
})
  .refine((entry) => entry.from <= entry.to, { message: 'must not be before from', path: ['to'] })
  .refine((entry) => !(inclusiveDays(entry.from, entry.to) > WAITLIST_MAX_DAYS), { message: `a wait of at most ${WAITLIST_MAX_DAYS} days`, path: ['to'] })
export type NewWaitlistEntryInput = z.infer<typeof NewWaitlistEntrySchema>

export const CloseWaitlistEntrySchema = z.object({
  reason: plainText(z.string({ error: 'must be text' }).trim().max(300, 'is too long')).default(''),
})

export const WaitlistListQuerySchema = z.object({
  siteId: IdSchema,
  state: z.enum(['open', 'booked', 'closed', 'all'], { error: 'must be open, booked, closed or all' }).default('open'),
})

/**
 * A freed gap: a cancelled or missed visit's time, or chair time named by site, chair and times (a move's
 * old slot, a shortened visit's tail), or by site and times alone: every chair of the site (a new shift or extra day).
 */
export const WaitlistGapQuerySchema = z.object({
  visitId: IdSchema.optional(),
  siteId: IdSchema.optional(),
  operatoryId: IdSchema.optional(),
  startUtc: utcInstant.optional(),
  endUtc: utcInstant.optional(),
})
  .refine((gap) => gap.visitId !== undefined || (gap.siteId !== undefined && gap.startUtc !== undefined && gap.endUtc !== undefined), { message: 'give visitId, or siteId, startUtc and endUtc (and operatoryId for one chair)', path: ['visitId'] })
  .refine((gap) => gap.startUtc === undefined || gap.endUtc === undefined || (Date.parse(gap.endUtc) > Date.parse(gap.startUtc) && Date.parse(gap.endUtc) - Date.parse(gap.startUtc) <= 12 * 3_600_000), { message: 'must be after startUtc and at most 12 hours later', path: ['endUtc'] })
export type WaitlistGapQuery = z.infer<typeof WaitlistGapQuerySchema>

export const SendOffersSchema = z.object({
  visitId: id('visit').optional(),
  siteId: id('site').optional(),
  operatoryId: id('operatory').optional(),
  startUtc: utcInstant.optional(),
  endUtc: utcInstant.optional(),
  entryIds: z.array(id('waitlist entry'), { error: 'must be a list of waitlist entries' }).min(1, 'choose at least one patient').max(50, 'at most 50 offers at once'),
})
  .refine((gap) => gap.visitId !== undefined || (gap.siteId !== undefined && gap.startUtc !== undefined && gap.endUtc !== undefined), { message: 'give visitId, or siteId, startUtc and endUtc (and operatoryId for one chair)', path: ['visitId'] })
  .refine((gap) => gap.startUtc === undefined || gap.endUtc === undefined || (Date.parse(gap.endUtc) > Date.parse(gap.startUtc) && Date.parse(gap.endUtc) - Date.parse(gap.startUtc) <= 12 * 3_600_000), { message: 'must be after startUtc and at most 12 hours later', path: ['endUtc'] })
export type SendOffersInput = z.infer<typeof SendOffersSchema>
