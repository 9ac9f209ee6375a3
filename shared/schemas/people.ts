// What the People screen sends: staff accounts and provider details.
import { z } from 'zod'
import { ROLES } from '../types/auth'
import { TEMPLATE_CATEGORIES } from '../types/chair-time'
import { NewPasswordSchema } from './auth'
import { IdSchema, plainText } from './common'
import { ColourSchema } from './local-time'

const role = z.enum(ROLES, { error: `must be one of ${ROLES.join(', ')}` })
const siteIds = z.array(IdSchema, { error: 'must be a list of site ids' }).max(100, 'has too many sites')

export const StaffSchema = z
  .object({
    email: plainText(z.string({ error: 'is required' }).trim().toLowerCase().min(1, 'is required').max(254, 'is too long').email('is not an e-mail address')),
    name: plainText(z.string({ error: 'is required' }).trim().min(1, 'is required').max(120, 'is too long')),
    role,
    allSites: z.boolean({ error: 'must be yes or no' }).default(false),
    siteIds: siteIds.default([]),
    password: NewPasswordSchema,
  })
  .refine((staff) => staff.allSites || staff.siteIds.length > 0, { path: ['siteIds'], message: 'choose at least one site, or all sites' })
export type StaffBody = z.infer<typeof StaffSchema>

export const StaffPatchSchema = z.object({
  name: plainText(z.string({ error: 'must be text' }).trim().min(1, 'is required').max(120, 'is too long')).optional(),
  role: role.optional(),
  allSites: z.boolean({ error: 'must be yes or no' }).optional(),
  siteIds: siteIds.optional(),
  active: z.boolean({ error: 'must be yes or no' }).optional(),
})
export type StaffPatch = z.infer<typeof StaffPatchSchema>

export const PasswordResetSchema = z.object({ password: NewPasswordSchema })

const categories = z.array(z.enum(TEMPLATE_CATEGORIES, { error: `must be one of ${TEMPLATE_CATEGORIES.join(', ')}` }), { error: 'must be a list' })

export const ProviderSchema = z.object({
  userId: IdSchema,
  colour: ColourSchema.default('#2563eb'),
  capabilities: categories.default([]),
})
export type ProviderBody = z.infer<typeof ProviderSchema>

export const ProviderPatchSchema = z.object({
  colour: ColourSchema.optional(),
  capabilities: categories.optional(),
  active: z.boolean({ error: 'must be yes or no' }).optional(),
})
export type ProviderPatch = z.infer<typeof ProviderPatchSchema>

export const ProviderQuerySchema = z.object({ siteId: IdSchema.optional() })
