// POST /api/openings: free times that fit a visit plan, across the caller's sites.
import { OpeningsRequestSchema } from '#shared/schemas/visits'
import type { OpeningsResponse } from '#shared/types/visits'
import { BOOKING_ROLES, requireRole } from '../utils/auth'
import { validateWith } from '../utils/errors'
import { searchOpenings } from '../services/openings-service'

export default defineEventHandler(async (event): Promise<OpeningsResponse> => {
  const user = requireRole(event, BOOKING_ROLES)
  const request = await readValidatedBody(event, validateWith(OpeningsRequestSchema))
  return searchOpenings(request, user)
})
