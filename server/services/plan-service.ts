// Turns requested plan items (template id or code, tooth, surfaces) into a visit plan.
import type { BookingUnitMinutes, PlanItemInput, VisitPlan } from '#shared/types/chair-time'
import type { ChairTimeRequest } from '#shared/schemas/templates'
import type { StoredTemplate } from '#shared/types/templates'
import { planVisit } from '#shared/domain/chair-time'
import type { Db } from '../utils/db'
import { badRequest, rethrowDomainError } from '../utils/errors'
import { findCurrentTemplateByCode, findTemplateById } from '../repositories/templates'

export interface ResolvedPlan {
  plan: VisitPlan
  templates: StoredTemplate[]
}

async function templateForItem(db: Db, item: ChairTimeRequest['items'][number], index: number): Promise<StoredTemplate> {
  const template = item.templateId !== undefined
    ? await findTemplateById(db, item.templateId)
    : await findCurrentTemplateByCode(db, item.templateCode!.toUpperCase())
  const field = item.templateId !== undefined ? `items.${index}.templateId` : `items.${index}.templateCode`
  if (!template) throw badRequest(field, 'no such template')
  if (!template.active) throw badRequest(field, `${template.name} is no longer in use`)
  return template
}

export async function planItems(db: Db, items: ChairTimeRequest['items'], unitMinutes: BookingUnitMinutes): Promise<ResolvedPlan> {
  const templates = await Promise.all(items.map((item, index) => templateForItem(db, item, index)))
  const inputs: PlanItemInput[] = items.map((item, index) => ({
    template: templates[index]!, tooth: item.tooth, teeth: item.teeth, notation: item.notation,
    surfaces: item.surfaces, anaesthesia: item.anaesthesia,
  }))
  try {
    return { plan: planVisit(inputs, { unitMinutes }), templates }
  } catch (error) {
    rethrowDomainError(error)
  }
}
