// GET /api/rota?siteId=|providerId=&from=&to=: the Rota grid for local dates from..to (inclusive):
// shift, extra, time-off and block entries, plus the records they come from.
import type { RotaView } from '#shared/types/rota-api'
import { RotaQuerySchema } from '#shared/schemas/rota'
import { requireUser } from '../utils/auth'
import { useDb } from '../utils/db'
import { validateWith } from '../utils/errors'
import { rotaView } from '../services/rota-view-service'

export default defineEventHandler(async (event): Promise<RotaView> => {
  const user = requireUser(event)
  const query = await getValidatedQuery(event, validateWith(RotaQuerySchema))
  return rotaView(useDb(), user, query)
})
