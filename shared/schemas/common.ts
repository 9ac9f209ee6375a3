import { z } from 'zod'

export const IdSchema = z.coerce
  .number({ error: 'must be a number' })
  .int('must be a whole number')
  .positive('must be positive')

export const SiteQuerySchema = z.object({ siteId: IdSchema })
