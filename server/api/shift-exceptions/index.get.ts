// GET /api/shift-exceptions?siteId=&providerId=: time off and extra days at the caller's sites
// (time off for every site included). Time-off reasons only for those who manage the provider.
import type { ShiftExceptionDto } from '#shared/types/rota-api'
import { RotaListQuerySchema } from '#shared/schemas/rota'
import { requireUser } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { validateWith } from '../../utils/errors'
import { rotaSiteIds } from '../../utils/rota-scope'
import { listShiftExceptions } from '../../repositories/shift-exceptions'
import { shownTimeOff } from '../../services/rota-view-service'

export default defineEventHandler(async (event): Promise<ShiftExceptionDto[]> => {
  const user = requireUser(event)
  const query = await getValidatedQuery(event, validateWith(RotaListQuerySchema))
  const db = useDb()
  const exceptions = await listShiftExceptions(db, { siteIds: await rotaSiteIds(db, user, query.siteId), providerId: query.providerId })
  return shownTimeOff(db, user, exceptions)
})
