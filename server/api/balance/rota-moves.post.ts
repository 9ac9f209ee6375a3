// POST /api/balance/rota-moves: Balance's rota move in one step (issue 17 §3). `dryRun: true` answers
// the whole move (both sites' hours, each on its own clock) and the visits it would strand, writing
// nothing (200); a save writes the day off and the extra day in one transaction (201). 400 names the
// field, 409 says in plain words why the day cannot move.
import type { RotaMoveAnswer } from '#shared/types/balance'
import { RotaMoveSchema } from '#shared/schemas/balance'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { moveRotaDay } from '../../services/rota-move-service'

export default defineEventHandler(async (event): Promise<RotaMoveAnswer> => {
  const user = requireRole(event, MANAGING_ROLES)
  const body = await readValidatedBody(event, validateWith(RotaMoveSchema))
  const answer = await moveRotaDay(user, body, body.dryRun === true)
  if (!answer.dryRun) setResponseStatus(event, 201)
  return answer
})
