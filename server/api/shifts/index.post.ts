// POST /api/shifts: a provider's recurring hours at a site (admins, managers of the site).
// 409 when the provider would be at two sites at once. `dryRun: true` checks it all and writes
// nothing (a new shift strands no visit: `strandedVisits` is empty), like the other rota changes.
import type { ShiftDto } from '#shared/types/rota-api'
import type { StrandedPreview } from '#shared/types/rebook'
import type { FreedWindowDto } from '#shared/types/waitlist'
import { ShiftSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { readDryRun } from '../../utils/dry-run'
import { createShift } from '../../services/rota-service'
import { freedByNewProviderTime } from '../../services/waitlist-service'

// The saved shift also answers `freed`: the provider time it adds in the next 14 days, for the waitlist (issue 17).
export default defineEventHandler(async (event): Promise<(ShiftDto & StrandedPreview & { freed: FreedWindowDto[] }) | StrandedPreview> => {
  const user = requireRole(event, MANAGING_ROLES)
  const body = await readValidatedBody(event, validateWith(ShiftSchema))
  requireSiteAccess(user, body.siteId)
  const result = await createShift(user, body, await readDryRun(event))
  if (result.dryRun) return { strandedVisits: result.strandedVisits }
  setResponseStatus(event, 201)
  return { ...result.saved, strandedVisits: result.strandedVisits, freed: await freedByNewProviderTime(result.saved.siteId, result.saved.providerId, { shiftId: result.saved.id }) }
})
