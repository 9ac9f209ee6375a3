// Live chair-time preview of a template being edited: the pure engine runs in the browser.
import type { ChairTimeTemplate, BookingUnitMinutes, VisitPlan } from '#shared/types/chair-time'
import { planVisit } from '#shared/domain/chair-time'
import { parseTooth } from '#shared/domain/teeth'
import { validSurfacesFor } from '#shared/domain/surfaces'
import { templateNeedsSurfaces, templateNeedsTooth } from '#shared/domain/template-validation'
import { DomainValidationError } from '#shared/domain/errors'

/** The first n surfaces a filling typically grows through: O, MO, MOD, MODB (posterior); M, MI, MID, MIDF (anterior). */
export function surfacesForCount(toothId: string, count: number): string {
  const tooth = parseTooth(toothId, 'universal')
  const order = tooth.region === 'posterior' ? ['O', 'M', 'D', 'B', 'L'] : ['M', 'I', 'D', 'F', 'L']
  const valid = new Set(validSurfacesFor(tooth))
  return order.filter((surface) => valid.has(surface as never)).slice(0, count).join('')
}

export function useTemplatePreview(
  template: Ref<ChairTimeTemplate>,
  tooth: Ref<string>,
  surfaceCount: Ref<number>,
  unitMinutes: Ref<BookingUnitMinutes>,
) {
  const result = computed<{ plan: VisitPlan | null; error: string | null }>(() => {
    try {
      const needsTooth = templateNeedsTooth(template.value)
      const plan = planVisit([{
        template: template.value,
        tooth: needsTooth ? tooth.value : undefined,
        surfaces: needsTooth && templateNeedsSurfaces(template.value) ? surfacesForCount(tooth.value, surfaceCount.value) : undefined,
      }], { unitMinutes: unitMinutes.value })
      return { plan, error: null }
    } catch (error) {
      if (error instanceof DomainValidationError) return { plan: null, error: error.reason }
      return { plan: null, error: 'This template cannot be previewed yet.' }
    }
  })
  return {
    plan: computed(() => result.value.plan),
    error: computed(() => result.value.error),
  }
}
