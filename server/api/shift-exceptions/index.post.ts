// POST /api/shift-exceptions: time off (a date range) or an extra one-off shift. `dryRun: true`
// answers the visits it would strand (200) and writes nothing; a save (201) flags them.
import type { ShiftExceptionDto } from '#shared/types/rota-api'
import type { StrandedPreview } from '#shared/types/rebook'
import type { FreedWindowDto } from '#shared/types/waitlist'
import { readDryRun } from '../../utils/dry-run'
import { ShiftExceptionSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { createShiftException } from '../../services/rota-service'
import { freedByNewProviderTime } from '../../services/waitlist-service'

// An extra shift also answers `freed`: the provider time it adds in the next 14 days, for the waitlist (issue 17).
export default defineEventHandler(async (event): Promise<(ShiftExceptionDto & StrandedPreview & { freed: FreedWindowDto[] }) | StrandedPreview> => {
  const user = requireRole(event, MANAGING_ROLES)
  const body = await readValidatedBody(event, validateWith(ShiftExceptionSchema))
  const result = await createShiftException(user, body, await readDryRun(event))
  if (result.dryRun) return { strandedVisits: result.strandedVisits }
  setResponseStatus(event, 201)
  const { saved } = result
  const freed = saved.kind === 'extra' && saved.siteId !== null ? await freedByNewProviderTime(saved.siteId, saved.providerId, { exceptionId: saved.id }) : []
  return { ...saved, strandedVisits: result.strandedVisits, freed }
})
