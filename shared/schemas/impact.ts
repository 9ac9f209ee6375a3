// `dryRun` on the routes whose change can strand booked visits (issue 13 §1): in a JSON body for
// POST, PATCH and PUT, as `?dryRun=true` for DELETE. Read beside the route's own schema.
import { z } from 'zod'
import { IdSchema } from './common'

export const DryRunBodySchema = z.object({ dryRun: z.boolean({ error: 'must be true or false' }).optional() })

export const DryRunQuerySchema = z.object({ dryRun: z.enum(['true', 'false'], { error: 'must be true or false' }).optional() })

export const RebookQuerySchema = z.object({ siteId: IdSchema })

