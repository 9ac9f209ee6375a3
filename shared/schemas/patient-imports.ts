// The CSV import's requests (issue 16 §3). The file travels as JSON text (the API takes JSON only).
import { z } from 'zod'
import { IMPORT_FIELDS } from '../domain/patient-import'
import { DATE_ORDERS } from '../types/display'
import { plainText } from './common'

const header = z.string({ error: 'must be a column name' }).max(200, 'is too long')

export const ImportUploadSchema = z.object({
  siteId: z.number({ error: 'must be a site id' }).int().positive().max(2 ** 31 - 1, 'must be a site id'),
  fileName: plainText(z.string({ error: 'is required' }).trim().min(1, 'is required').max(200, 'is too long')),
  /** The file's text; its size is checked by the service (413 beyond 10 MB). */
  csv: z.string({ error: 'must be the file as text' }).min(1, 'the file is empty'),
})
export type ImportUploadInput = z.infer<typeof ImportUploadSchema>

export const ImportMappingSchema = z.object({
  mapping: z.partialRecord(z.enum(IMPORT_FIELDS, { error: 'is not a field the import fills' }), header),
  dateOrder: z.enum(DATE_ORDERS, { error: `must be one of ${DATE_ORDERS.join(', ')}` }),
})
export type ImportMappingInput = z.infer<typeof ImportMappingSchema>

export const ImportRunSchema = ImportMappingSchema.extend({
  /** Per file line: what to do with a likely duplicate (skip unless said otherwise). */
  choices: z.record(z.string().regex(/^\d{1,7}$/, 'must be a line number'), z.enum(['skip', 'merge', 'create'], { error: 'must be skip, merge or create' })).default({}),
})
export type ImportRunInput = z.infer<typeof ImportRunSchema>
