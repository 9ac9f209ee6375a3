// Turns requested plan items (template id or code, tooth, surfaces) into a visit plan.
import type { BookingUnitMinutes, PlanItemInput, VisitPlan } from '#shared/types/chair-time'
import type { ChairTimeRequest } from '#shared/schemas/templates'
import type { StoredTemplate } from '#shared/types/templates'
import { planVisit } from '#shared/domain/chair-time'
import type { Db } from '../utils/db'
import { badRequest, rethrowDomainError } from '../utils/errors'
import { templateStatement } from '../repositories/templates'
import { allOf, inOneTrip, type Statement } from '../repositories/round-trip'

export interface ResolvedPlan {
  plan: VisitPlan
  templates: StoredTemplate[]
}

type PlanItemRequest = ChairTimeRequest['items'][number]

/** The reads of each item's template, to go with a transaction's other first reads in one round trip. */
export function planTemplateStatement(db: Db, items: readonly PlanItemRequest[]): Statement<Array<StoredTemplate | undefined>> {
  return allOf(items.map((item) => templateStatement(db, item.templateId !== undefined ? { id: item.templateId } : { code: item.templateCode!.toUpperCase() })))
}

function usableTemplate(item: PlanItemRequest, index: number, template: StoredTemplate | undefined): StoredTemplate {
  const field = item.templateId !== undefined ? `items.${index}.templateId` : `items.${index}.templateCode`
  if (!template) throw badRequest(field, 'no such template')
  if (!template.active) throw badRequest(field, `${template.name} is no longer in use`)
  return template
}

/** The plan from the items and the templates their statements read (400 naming the item when one is missing or retired). */
export function planFromTemplates(items: readonly PlanItemRequest[], found: readonly (StoredTemplate | undefined)[], unitMinutes: BookingUnitMinutes): ResolvedPlan {
  const templates = items.map((item, index) => usableTemplate(item, index, found[index]))
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

export async function planItems(db: Db, items: ChairTimeRequest['items'], unitMinutes: BookingUnitMinutes): Promise<ResolvedPlan> {
  const [found] = await inOneTrip(db, [planTemplateStatement(db, items)])
  return planFromTemplates(items, found, unitMinutes)
}
