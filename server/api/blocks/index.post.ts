// POST /api/blocks: unbookable time for a site, a room or a provider; one-off or recurring.
// `dryRun: true` answers the visits it would strand (200) and writes nothing; a save (201) flags them.
import type { BlockDto } from '#shared/types/rota-api'
import type { StrandedPreview } from '#shared/types/rebook'
import { readDryRun } from '../../utils/dry-run'
import { BlockSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { createBlock } from '../../services/rota-service'

export default defineEventHandler(async (event): Promise<(BlockDto & StrandedPreview) | StrandedPreview> => {
  const user = requireRole(event, MANAGING_ROLES)
  const body = await readValidatedBody(event, validateWith(BlockSchema))
  requireSiteAccess(user, body.siteId)
  const result = await createBlock(user, body, await readDryRun(event))
  if (result.dryRun) return { strandedVisits: result.strandedVisits }
  setResponseStatus(event, 201)
  return { ...result.saved, strandedVisits: result.strandedVisits }
})
