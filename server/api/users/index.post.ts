// POST /api/users: a new staff account (admins only); dentists and hygienists also become providers.
import type { StaffAccount } from '#shared/types/people'
import { StaffSchema } from '#shared/schemas/people'
import { requireRole } from '../../utils/auth'
import { validateWith } from '../../utils/errors'
import { createStaff } from '../../services/people-service'

export default defineEventHandler(async (event): Promise<StaffAccount> => {
  const user = requireRole(event, ['admin'])
  const body = await readValidatedBody(event, validateWith(StaffSchema))
  setResponseStatus(event, 201)
  return createStaff(user, body)
})
