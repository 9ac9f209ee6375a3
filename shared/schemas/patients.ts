// Patient records (issue 16): the edit form and PATCH /api/patients/:id share these, as do the
// CSV import's rows and the merge's choices.
import { z } from 'zod'
import { MAX_ID } from '../domain/input-bounds'
import { toE164 } from '../domain/phone'
import { IdSchema, plainText } from './common'
import { calendarDate } from './local-time'

export const CONSENT_SOURCES = ['desk', 'form', 'phone', 'email', 'import'] as const
export type ConsentSource = (typeof CONSENT_SOURCES)[number]
export const CONSENT_SOURCE_LABELS: Record<ConsentSource, string> = {
  desk: 'said so at the desk', form: 'signed form', phone: 'on the phone', email: 'by e-mail', import: 'imported file',
}

/** '' and blanks become null, so a cleared form field clears the value. */
const blankToNull = (value: unknown) => (typeof value === 'string' && value.trim() === '' ? null : value)

/** Optional one-line text of at most `max` characters; empty means none. */
export function optionalText(max: number) {
  return z.preprocess(blankToNull, plainText(z.string({ error: 'must be text' }).trim().max(max, `is too long (at most ${max} characters)`)).nullable()).optional()
}

export function requiredName(max = 80) {
  return plainText(z.string({ error: 'is required' }).trim().min(1, 'is required').max(max, `is too long (at most ${max} characters)`))
}

export const emailField = z.preprocess(blankToNull,
  plainText(z.string({ error: 'must be text' }).trim().toLowerCase().max(254, 'is too long').email('is not an e-mail address')).nullable()).optional()

/** A phone typed nationally ("(209) 555-0177") or internationally ("+1 209 555 0177"), stored in E.164. */
export const phoneField = z.preprocess(blankToNull, z.string({ error: 'must be text' }).trim().max(30, 'is not a phone number')
  .transform((text, ctx) => {
    const e164 = toE164(text)
    if (!e164) { ctx.addIssue({ code: 'custom', message: 'is not a phone number (for example (209) 555-0177 or +1 209 555 0177)' }); return z.NEVER }
    return e164
  }).nullable()).optional()

export const birthDateField = calendarDate('must be a date such as 1980-04-30')
  .refine((date) => date >= '1900-01-01', 'must be 1900-01-01 or later')
  .refine((date) => date <= new Date().toISOString().slice(0, 10), 'cannot be in the future')

const consentSource = z.preprocess(blankToNull, z.enum(CONSENT_SOURCES, { error: 'must say how the patient agreed' }).nullable()).optional()
const siteId = z.preprocess(blankToNull, z.number({ error: 'must be a site id' }).int('must be a site id').positive('must be a site id').max(MAX_ID, 'must be a site id').nullable()).optional()

export const PatientFieldsSchema = z.object({
  firstName: requiredName(),
  lastName: requiredName(),
  preferredName: optionalText(80),
  dateOfBirth: birthDateField,
  email: emailField,
  phone: phoneField,
  addressStreet: optionalText(200),
  addressCity: optionalText(100),
  addressRegion: optionalText(100),
  addressPostalCode: optionalText(20),
  preferredSiteId: siteId,
  emailConsent: z.boolean({ error: 'must be yes or no' }).default(false),
  emailConsentSource: consentSource,
  smsConsent: z.boolean({ error: 'must be yes or no' }).default(false),
  smsConsentSource: consentSource,
  guardianName: optionalText(160),
  guardianEmail: emailField,
  guardianPhone: phoneField,
  frontDeskNote: optionalText(500),
  alertText: optionalText(120),
})

type PatientFields = z.infer<typeof PatientFieldsSchema>

/** Consent needs a way to reach the patient and a word on how they agreed. */
function consentProblems(patient: PatientFields, ctx: z.RefinementCtx): void {
  if (patient.emailConsent && !patient.email && !patient.guardianEmail) ctx.addIssue({ code: 'custom', message: 'needs an e-mail address', path: ['emailConsent'] })
  if (patient.emailConsent && !patient.emailConsentSource) ctx.addIssue({ code: 'custom', message: 'say how the patient agreed', path: ['emailConsentSource'] })
  if (patient.smsConsent && !patient.phone && !patient.guardianPhone) ctx.addIssue({ code: 'custom', message: 'needs a mobile phone', path: ['smsConsent'] })
  if (patient.smsConsent && !patient.smsConsentSource) ctx.addIssue({ code: 'custom', message: 'say how the patient agreed', path: ['smsConsentSource'] })
}

export const PatientEditSchema = PatientFieldsSchema.extend({
  rowVersion: z.number({ error: 'is required (the version you last saw)' }).int('must be a whole number').positive('must be positive').max(MAX_ID, `must be at most ${MAX_ID}`),
}).superRefine(consentProblems)
export type PatientEditInput = z.infer<typeof PatientEditSchema>
export type PatientFieldsInput = z.infer<typeof PatientFieldsSchema>

/** GET /api/patients/duplicates: what the registration form has so far. */
export const DuplicateCheckSchema = z.object({
  firstName: requiredName(),
  lastName: requiredName(),
  dateOfBirth: birthDateField,
  email: emailField,
  phone: phoneField,
  exceptId: IdSchema.optional(),
})
export type DuplicateCheckInput = z.infer<typeof DuplicateCheckSchema>

/** The fields whose value a merge takes from one record or the other. */
export const MERGE_FIELDS = [
  'firstName', 'lastName', 'preferredName', 'dateOfBirth', 'email', 'phone', 'addressStreet', 'addressCity', 'addressRegion',
  'addressPostalCode', 'preferredSiteId', 'emailConsent', 'smsConsent', 'guardianName', 'guardianEmail', 'guardianPhone', 'frontDeskNote', 'alertText',
] as const
export type MergeField = (typeof MERGE_FIELDS)[number]

export const PatientMergeSchema = z.object({
  survivorId: z.number({ error: 'must be a patient id' }).int().positive().max(MAX_ID, 'must be a patient id'),
  mergedId: z.number({ error: 'must be a patient id' }).int().positive().max(MAX_ID, 'must be a patient id'),
  /** Which record each field's value comes from; fields left out keep the survivor's. */
  take: z.partialRecord(z.enum(MERGE_FIELDS, { error: 'is not a field a merge can take' }), z.enum(['survivor', 'merged'], { error: 'must be survivor or merged' })).default({}),
}).refine((merge) => merge.survivorId !== merge.mergedId, { message: 'must be another patient than the one kept', path: ['mergedId'] })
export type PatientMergeInput = z.infer<typeof PatientMergeSchema>
