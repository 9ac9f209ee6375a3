// Live chair time for the drawer's procedures, computed in the browser by the shared engine.
import type { AnaesthesiaTechnique, BookingUnitMinutes, VisitPlan } from '#shared/types/chair-time'
import type { StoredTemplate } from '#shared/types/templates'
import { planVisit } from '#shared/domain/chair-time'
import { DomainValidationError } from '#shared/domain/errors'
import { templateNeedsSurfaces, templateNeedsTooth } from '#shared/domain/template-validation'

export interface DraftItem {
  templateCode: string
  tooth: string
  surfaces: string[]
  /** The technique chosen in the drawer (issue 13 §4); absent: the template's default for the tooth's arch. */
  anaesthesia?: AnaesthesiaTechnique
}

export function toRequestItems(items: DraftItem[], templates: StoredTemplate[]) {
  return items.map((item) => {
    const template = templates.find((entry) => entry.code === item.templateCode)
    const needsTooth = template ? templateNeedsTooth(template) : false
    return {
      templateCode: item.templateCode,
      ...(needsTooth ? { tooth: item.tooth } : {}),
      ...(needsTooth && template && templateNeedsSurfaces(template) ? { surfaces: item.surfaces.join('') } : {}),
      ...(needsTooth && template?.anaesthesia.required && item.anaesthesia ? { anaesthesia: item.anaesthesia } : {}),
    }
  })
}

export function useVisitPlanPreview(items: Ref<DraftItem[]>, templates: Ref<StoredTemplate[]>, unit: Ref<BookingUnitMinutes>) {
  return computed<{ plan: VisitPlan | null; field: string | null; reason: string | null }>(() => {
    try {
      const inputs = toRequestItems(items.value, templates.value).map((item) => ({
        template: templates.value.find((entry) => entry.code === item.templateCode)!,
        tooth: item.tooth, surfaces: item.surfaces, anaesthesia: item.anaesthesia,
      }))
      if (inputs.some((input) => !input.template)) return { plan: null, field: null, reason: 'Choose a procedure' }
      return { plan: planVisit(inputs, { unitMinutes: unit.value }), field: null, reason: null }
    } catch (error) {
      if (error instanceof DomainValidationError) return { plan: null, field: error.field, reason: error.reason }
      return { plan: null, field: null, reason: 'This visit cannot be planned yet' }
    }
  })
}
