import { DATE_ORDERS } from '../types/display'
import { z } from 'zod'
import { ChairTimeItemSchema } from './templates'
import { VISIT_STATES } from '../domain/visit-states'
import { inclusiveDays, MAX_ID, MAX_VISIT_MINUTES, MAX_WINDOW_DAYS } from '../domain/input-bounds'
import { dateInBounds, IdSchema, instantInBounds, plainText } from './common'
import { calendarDate } from './local-time'
import { PatientFieldsSchema } from './patients'

const id = (what: string) => z.number({ error: `must be a ${what} id` }).int(`must be a ${what} id`).positive(`must be a ${what} id`).max(MAX_ID, `must be a ${what} id`)
const rowVersion = z.number({ error: 'must be the version you last saw' }).int('must be a whole number').positive('must be positive').max(MAX_ID, `must be at most ${MAX_ID}`)
const utcInstant = z.string({ error: 'is required' }).datetime({ offset: true, message: 'must be an ISO date-time such as 2027-01-11T17:00:00Z' }).superRefine(instantInBounds)
const note = plainText(z.string({ error: 'must be text' }).max(1000, 'is too long'))
const planItems = z.array(ChairTimeItemSchema, { error: 'must be a list of procedures' }).min(1, 'add at least one procedure').max(8, 'at most 8 procedures in one visit')

export const BookVisitSchema = z.object({
  patientId: id('patient'),
  siteId: id('site'),
  operatoryId: id('operatory'),
  providerId: id('provider'),
  startUtc: utcInstant,
  items: planItems,
  note: note.default(''),
})
export type BookVisitInput = z.infer<typeof BookVisitSchema>

export const MoveVisitSchema = z.object({
  rowVersion: z.number({ error: 'is required (the version you last saw)' }).int('must be a whole number').positive('must be positive').max(MAX_ID, `must be at most ${MAX_ID}`),
  startUtc: utcInstant.optional(),
  /** Another site in the caller's scope (the Rebook list moves a stranded visit there): chair and provider required. */
  siteId: id('site').optional(),
  operatoryId: id('operatory').optional(),
  providerId: id('provider').optional(),
  items: planItems.optional(),
  note: note.optional(),
  /** The length set by hand; the plan decides it otherwise. */
  lengthOverride: z.object({
    chairMinutes: z.number({ error: 'must be a number of minutes' }).int('must be whole minutes').min(5, 'must be at least 5').max(MAX_VISIT_MINUTES, `must be at most ${MAX_VISIT_MINUTES} (8 hours), the longest visit`),
    reason: plainText(z.string({ error: 'is required' }).trim().min(3, 'say why the length changes').max(200, 'is too long')),
  }).optional(),
})
export type MoveVisitInput = z.infer<typeof MoveVisitSchema>

export const ChangeStateSchema = z.object({
  state: z.enum(VISIT_STATES, { error: `must be one of ${VISIT_STATES.join(', ')}` }),
  rowVersion: rowVersion.optional(),
})

/** Undo and "anaesthetic given": only the version the caller last saw (a stale one is a 409). */
export const VisitVersionSchema = z.object({
  rowVersion: z.number({ error: 'is required (the version you last saw)' }).int('must be a whole number').positive('must be positive').max(MAX_ID, `must be at most ${MAX_ID}`),
})

export const CancelSchema = z.object({
  reason: plainText(z.string({ error: 'is required' }).trim().min(1, 'is required').max(300, 'is too long')),
  rowVersion: rowVersion.optional(),
})

export const PatientSearchSchema = z.object({
  q: plainText(z.string({ error: 'is required' }).trim().min(2, 'type at least 2 characters').max(100, 'is too long')),
  limit: z.coerce.number().int().min(1).max(50).default(20),
  /** How a typed birth date is read besides ISO (the searching screen's site order). */
  dateOrder: z.enum(DATE_ORDERS, { error: `must be one of ${DATE_ORDERS.join(', ')}` }).default('month-day-year'),
})

/** Registering: every field of the record may be given; consent without a source is taken as said at the desk. */
export const NewPatientSchema = PatientFieldsSchema
  .refine((patient) => !patient.emailConsent || Boolean(patient.email || patient.guardianEmail), { message: 'needs an e-mail address', path: ['emailConsent'] })
  .refine((patient) => !patient.smsConsent || Boolean(patient.phone || patient.guardianPhone), { message: 'needs a mobile phone', path: ['smsConsent'] })
export type NewPatientInput = z.infer<typeof NewPatientSchema>

const localDate = calendarDate('must be a date such as 2027-01-11').superRefine(dateInBounds)

export const OpeningsRequestSchema = z.object({
  items: planItems,
  siteIds: z.array(id('site')).min(1, 'choose at least one site').max(20).optional(),
  providerId: id('provider').optional(),
  operatoryId: id('operatory').optional(),
  from: localDate,
  to: localDate,
  partOfDay: z.enum(['morning', 'afternoon', 'any'], { error: 'must be morning, afternoon or any' }).default('any'),
  limit: z.number().int().min(1, 'must be at least 1').max(500, 'must be at most 500').default(10),
  fewestGaps: z.boolean().default(false),
  /** Every active site of the group, those outside the caller's scope marked (`inScope: false`, not bookable by them). */
  wholeGroup: z.boolean({ error: 'must be true or false' }).default(false),
})
  .refine((request) => request.from <= request.to, { message: 'must not be before from', path: ['to'] })
  .refine((request) => !(inclusiveDays(request.from, request.to) > MAX_WINDOW_DAYS), { message: `search at most ${MAX_WINDOW_DAYS} days at once`, path: ['to'] })
export type OpeningsRequest = z.infer<typeof OpeningsRequestSchema>

export const VisitListQuerySchema = z.object({
  siteId: IdSchema.optional(),
  providerId: IdSchema.optional(),
  patientId: IdSchema.optional(),
  fromUtc: z.string({ error: 'is required' }).datetime({ offset: true, message: 'must be an ISO date-time' }).superRefine(instantInBounds),
  toUtc: z.string({ error: 'is required' }).datetime({ offset: true, message: 'must be an ISO date-time' }).superRefine(instantInBounds),
  includeCancelled: z.enum(['true', 'false']).default('false'),
})
  .refine((query) => query.siteId !== undefined || query.providerId !== undefined || query.patientId !== undefined, { message: 'give siteId, providerId or patientId', path: ['siteId'] })
  .refine((query) => Date.parse(query.toUtc) > Date.parse(query.fromUtc), { message: 'must be after fromUtc', path: ['toUtc'] })
  .refine((query) => Date.parse(query.toUtc) - Date.parse(query.fromUtc) <= 43 * 86_400_000, { message: 'at most 6 weeks at once', path: ['toUtc'] })
