// Whether a change request asks for a preview only (`dryRun`, issue 13 §1); 400 when it is not a yes/no.
import type { H3Event } from 'h3'
import { DryRunBodySchema, DryRunQuerySchema } from '#shared/schemas/impact'
import { validateWith } from './errors'

export async function readDryRun(event: H3Event): Promise<boolean> {
  if (event.method === 'DELETE') return (await getValidatedQuery(event, validateWith(DryRunQuerySchema))).dryRun === 'true'
  return (await readValidatedBody(event, validateWith(DryRunBodySchema))).dryRun === true
}
