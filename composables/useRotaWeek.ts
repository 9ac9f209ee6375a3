// The Rota grid's week: the entries of one site or one provider for the week starting `weekStart`.
import type { RotaView } from '#shared/types/rota-api'
import { addDays } from '#shared/utils/local-date'

export interface RotaScope {
  siteId?: number
  providerId?: number
}

export function useRotaWeek(scope: Ref<RotaScope | null>, weekStart: Ref<string>) {
  const weekEnd = computed(() => addDays(weekStart.value, 6))
  const view = useFetch<RotaView>('/api/rota', {
    key: computed(() => `rota-${JSON.stringify(scope.value)}-${weekStart.value}`),
    query: computed(() => ({ ...scope.value, from: weekStart.value, to: weekEnd.value })),
    watch: [scope, weekStart],
    immediate: scope.value !== null,
  })
  return { ...view, weekEnd }
}
