// PATCH /api/shifts/:id: change a shift; the merged shift is validated and clash-checked again.
import type { ShiftDto } from '#shared/types/rota-api'
import { ShiftPatchSchema, ShiftSchema } from '#shared/schemas/rota'
import { MANAGING_ROLES, requireRole, requireSiteAccess } from '../../utils/auth'
import { assertValid, notFound, numericParam, validateWith } from '../../utils/errors'
import { findShift } from '../../repositories/shifts'
import { replaceShift } from '../../services/rota-service'
import { inTransaction } from '../../utils/db-retry'

export default defineEventHandler(async (event): Promise<ShiftDto> => {
  const user = requireRole(event, MANAGING_ROLES)
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(ShiftPatchSchema))
  return inTransaction(async (trx) => {
    const before = await findShift(trx, id)
    if (!before) throw notFound('No such shift.')
    requireSiteAccess(user, before.siteId)
    const { id: _id, ruleText: _text, ...stored } = before
    return replaceShift(trx, user, before, assertValid(ShiftSchema, { ...stored, ...patch }))
  })
})
