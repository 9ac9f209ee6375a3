// GET /api/users: staff accounts in the caller's scope (admins and managers read; admins change).
import type { StaffAccount } from '#shared/types/people'
import { MANAGING_ROLES, requireRole } from '../../utils/auth'
import { useDb } from '../../utils/db'
import { listStaff } from '../../services/people-service'

export default defineEventHandler(async (event): Promise<StaffAccount[]> => {
  const user = requireRole(event, MANAGING_ROLES)
  return listStaff(useDb(), user)
})
