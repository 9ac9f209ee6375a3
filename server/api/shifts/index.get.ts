// GET /api/shifts?siteId=&providerId=: shifts at the caller's sites, narrowed by either filter.
import type { ShiftDto } from '#shared/types/rota-api'
import { RotaListQuerySchema } from '#shared/schemas/rota'
import { requireUser } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { shiftList } from '../../services/rota-view-service'

export default defineEventHandler(async (event): Promise<ShiftDto[]> => {
  const user = requireUser(event)
  const query = await getValidatedQuery(event, validateWith(RotaListQuerySchema))
  return shiftList(user, query)
})
