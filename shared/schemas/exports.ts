// Spreadsheet exports (issue 16 §3).
import { z } from 'zod'
import { inclusiveDays, MAX_WINDOW_DAYS } from '../domain/input-bounds'
import { IdSchema, plainText } from './common'
import { LocalDateSchema } from './local-time'

export const PatientsExportSchema = z.object({
  q: plainText(z.string({ error: 'must be text' }).trim().min(2, 'type at least 2 characters').max(100, 'is too long')).optional(),
  /** The site whose date order the file uses. */
  siteId: IdSchema.optional(),
})

export const VisitsExportSchema = z.object({
  siteId: IdSchema,
  from: LocalDateSchema,
  to: LocalDateSchema,
})
  .refine((query) => query.from <= query.to, { message: 'must not be before from', path: ['to'] })
  .refine((query) => !(inclusiveDays(query.from, query.to) > MAX_WINDOW_DAYS), { message: `export at most ${MAX_WINDOW_DAYS} days at once`, path: ['to'] })
export type VisitsExportQuery = z.infer<typeof VisitsExportSchema>
