// Visits of one site or one provider over a UTC range (GET /api/visits), cached per scope and
// range. The key follows the scope, so a scope that is only known later (the signed-in provider)
// still fetches; a null scope is an empty list.
import type { BoardVisitDto } from '#shared/types/visits'
import type { UtcRange } from '#shared/utils/local-date'

export interface VisitScope {
  siteId?: number
  providerId?: number
  /** Cancelled visits too (the Chairboard's "Show cancelled"). */
  includeCancelled?: 'true'
}

export function useVisitList(scope: Ref<VisitScope | null>, range: Ref<UtcRange>) {
  const fetcher = useRequestFetch()
  return useAsyncData<BoardVisitDto[]>(
    computed(() => `visits-${JSON.stringify(scope.value)}-${range.value.fromUtc}-${range.value.toUtc}`),
    (_nuxtApp, { signal }) => (scope.value === null
      ? Promise.resolve([])
      : fetcher<BoardVisitDto[]>('/api/visits', { query: { ...scope.value, fromUtc: range.value.fromUtc, toUtc: range.value.toUtc }, signal })),
    { default: () => [] },
  )
}
