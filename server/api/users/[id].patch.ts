// PATCH /api/users/:id: name, role, site scope, or deactivate/reactivate (admins only).
import type { StaffAccount } from '#shared/types/people'
import { StaffPatchSchema } from '#shared/schemas/people'
import { requireRole } from '../../utils/auth'
import { numericParam, validateWith } from '../../utils/errors'
import { changeStaff } from '../../services/people-service'

export default defineEventHandler(async (event): Promise<StaffAccount> => {
  const user = requireRole(event, ['admin'])
  const id = numericParam(event, 'id')
  const patch = await readValidatedBody(event, validateWith(StaffPatchSchema))
  return changeStaff(user, id, patch)
})
