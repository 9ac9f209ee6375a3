// GET /api/shift-exceptions?siteId=&providerId=: time off and extra days at the caller's sites
// (time off for every site included). Time-off reasons only for those who manage the provider.
import type { ShiftExceptionDto } from '#shared/types/rota-api'
import { RotaListQuerySchema } from '#shared/schemas/rota'
import { requireUser } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { shiftExceptionList } from '../../services/rota-view-service'

export default defineEventHandler(async (event): Promise<ShiftExceptionDto[]> => {
  const user = requireUser(event)
  const query = await getValidatedQuery(event, validateWith(RotaListQuerySchema))
  return shiftExceptionList(user, query)
})
