// GET /api/shifts?siteId=&providerId=: shifts at the caller's sites, narrowed by either filter.
import type { ShiftDto } from '#shared/types/rota-api'
import { RotaListQuerySchema } from '#shared/schemas/rota'
import { requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { validateWith } from '../../utils/errors'
import { rotaSiteIds } from '../../utils/rota-scope'
import { listShifts } from '../../repositories/shifts'

export default defineEventHandler(async (event): Promise<ShiftDto[]> => {
  const user = requireUser(event)
  const query = await getValidatedQuery(event, validateWith(RotaListQuerySchema))
  const db = useDb()
  return listShifts(db, { siteIds: await rotaSiteIds(db, user, query.siteId), providerId: query.providerId })
})
