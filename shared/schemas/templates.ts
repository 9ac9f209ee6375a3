// The shape of a chair-time template as the editor sends it. Clinical and timing rules are checked
// afterwards by shared/domain/template-validation.ts, so each problem names its field.
import { z } from 'zod'
import {
  ANAESTHESIA_TECHNIQUES, OPERATORY_CAPABILITIES, STEP_KINDS, STEP_ROLES, TEMPLATE_CATEGORIES,
} from '../types/chair-time'
import { MAX_ID } from '../domain/input-bounds'
import { plainText } from './common'

const minutes = z.number({ error: 'must be a number of minutes' }).int('must be whole minutes').min(0, 'must be 0 or more').max(480, 'must be at most 480')

const timing = z.object({ injectMinutes: minutes, onsetMinutes: minutes })

const arch = z.object({
  technique: z.enum(ANAESTHESIA_TECHNIQUES, { error: `must be one of ${ANAESTHESIA_TECHNIQUES.join(', ')}` }),
  infiltration: timing,
  block: timing,
})

export const TemplateStepSchema = z.object({
  label: plainText(z.string({ error: 'is required' }).trim().min(1, 'is required').max(120, 'is too long')),
  kind: z.enum(STEP_KINDS, { error: `must be one of ${STEP_KINDS.join(', ')}` }),
  baseMinutes: minutes,
  perExtraSurfaceMinutes: minutes.default(0),
  perExtraToothMinutes: minutes.default(0),
  role: z.enum(STEP_ROLES, { error: `must be one of ${STEP_ROLES.join(', ')}` }).optional(),
})

export const TemplateSchema = z.object({
  code: z.string({ error: 'is required' }).trim().toUpperCase().regex(/^[A-Z0-9][A-Z0-9-]{0,23}$/, 'use 1 to 24 letters, digits or dashes'),
  name: plainText(z.string({ error: 'is required' }).trim().min(1, 'is required').max(120, 'is too long')),
  category: z.enum(TEMPLATE_CATEGORIES, { error: `must be one of ${TEMPLATE_CATEGORIES.join(', ')}` }),
  capability: z.enum(OPERATORY_CAPABILITIES, { error: `must be one of ${OPERATORY_CAPABILITIES.join(', ')}` }),
  needsTooth: z.boolean().optional(),
  needsSurfaces: z.boolean().optional(),
  region: z.enum(['anterior', 'posterior']).optional(),
  steps: z.array(TemplateStepSchema).min(1, 'needs at least one step').max(30, 'has too many steps'),
  anaesthesia: z.object({ required: z.boolean({ error: 'must be yes or no' }), maxillary: arch, mandibular: arch }),
})
export type TemplateInput = z.infer<typeof TemplateSchema>

const toothNotation = z.enum(['universal', 'iso'], { error: 'must be universal or iso' })

export const ChairTimeItemSchema = z.object({
  templateId: z.number({ error: 'must be a template id' }).int('must be a template id').positive('must be a template id').max(MAX_ID, 'must be a template id').optional(),
  templateCode: z.string().trim().min(1).max(24).optional(),
  tooth: z.union([z.string(), z.number()]).transform(String).optional(),
  teeth: z.array(z.union([z.string(), z.number()]).transform(String)).max(8, 'at most 8 extra teeth').optional(),
  notation: toothNotation.optional(),
  surfaces: z.string().max(12, 'is too long').optional(),
  anaesthesia: z.enum(['none', 'infiltration', 'block'], { error: 'must be none, infiltration or block' }).optional(),
}).refine((item) => item.templateId !== undefined || item.templateCode !== undefined, {
  message: 'give templateId or templateCode', path: ['templateId'],
})

export const ChairTimeRequestSchema = z.object({
  siteId: z.number({ error: 'must be a site id' }).int('must be a site id').positive('must be a site id').max(MAX_ID, 'must be a site id').optional(),
  items: z.array(ChairTimeItemSchema, { error: 'must be a list of procedures' }).min(1, 'add at least one procedure').max(8, 'at most 8 procedures in one visit'),
})
export type ChairTimeRequest = z.infer<typeof ChairTimeRequestSchema>
