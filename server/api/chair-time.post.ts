// POST /api/chair-time: how long a visit plan holds a chair and when it needs the provider.
import { ChairTimeRequestSchema } from '#shared/schemas/templates'
import type { ChairTimeResponse } from '#shared/types/templates'
import { requireUser } from '../utils/auth'
import { validateWith } from '../utils/errors'
import { computeChairTime } from '../services/template-service'

export default defineEventHandler(async (event): Promise<ChairTimeResponse> => {
  const user = requireUser(event)
  const request = await readValidatedBody(event, validateWith(ChairTimeRequestSchema))
  const plan = await computeChairTime(request, user)
  return {
    chairMinutes: plan.chairMinutes,
    providerMinutes: plan.providerMinutes,
    assistantMinutes: plan.assistantMinutes,
    numbingMinutes: plan.numbingMinutes,
    unitMinutes: plan.unitMinutes,
    segments: plan.segments.map(({ kind, label, startMinute, endMinute }) => ({ kind, label, startMinute, endMinute })),
    explanation: plan.explanation,
    items: plan.items,
  }
})
