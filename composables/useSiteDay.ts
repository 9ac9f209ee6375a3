// Operatories (chairs), open times and who is on shift for one site day (the Chairboard's background).
import type { AvailabilityResponse } from '#shared/types/rota-api'
import type { OperatorySummary } from '#shared/types/sites'
import type { ProviderSummary } from '#shared/types/people'

export function useSiteDay(siteId: Ref<number | null>, date: Ref<string>) {
  const enabled = computed(() => siteId.value !== null)
  const { data: operatories } = useFetch<OperatorySummary[]>('/api/operatories', {
    key: computed(() => `board-operatories-${siteId.value}`), query: computed(() => ({ siteId: siteId.value })),
    immediate: enabled.value, watch: [siteId], default: () => [],
  })
  const { data: providers } = useFetch<ProviderSummary[]>('/api/providers', {
    key: computed(() => `board-providers-${siteId.value}`), query: computed(() => ({ siteId: siteId.value })),
    immediate: enabled.value, watch: [siteId], default: () => [],
  })
  const { data: availability } = useFetch<AvailabilityResponse | null>('/api/availability', {
    key: computed(() => `board-availability-${siteId.value}-${date.value}`),
    query: computed(() => ({ siteId: siteId.value, from: date.value, to: date.value })),
    immediate: enabled.value, watch: [siteId, date], default: () => null,
  })
  const activeOperatories = computed(() => (operatories.value ?? []).filter((operatory) => operatory.active))
  return { operatories: activeOperatories, providers, availability }
}
