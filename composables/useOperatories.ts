import type { OperatorySummary } from '#shared/types/sites'

/** The operatories (chairs) of one site, cached per site id. */
export function useOperatories(siteId: Ref<number | null>) {
  return useFetch<OperatorySummary[]>('/api/operatories', {
    key: computed(() => `operatories-${siteId.value}`),
    query: computed(() => ({ siteId: siteId.value })),
    immediate: siteId.value !== null,
    watch: [siteId],
    default: () => [],
  })
}
