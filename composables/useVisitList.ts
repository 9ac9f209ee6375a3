// Visits of one site or one provider over a UTC range (GET /api/appointments), cached per scope and range.
import type { BoardVisitDto } from '#shared/types/appointments'
import type { UtcRange } from './useVisitTimes'

export interface VisitScope {
  siteId?: number
  providerId?: number
}

export function useVisitList(scope: Ref<VisitScope | null>, range: Ref<UtcRange>) {
  return useFetch<BoardVisitDto[]>('/api/appointments', {
    key: computed(() => `visits-${JSON.stringify(scope.value)}-${range.value.from}-${range.value.to}`),
    query: computed(() => ({ ...scope.value, from: range.value.from, to: range.value.to })),
    immediate: scope.value !== null,
    watch: [scope, range],
    default: () => [],
  })
}
