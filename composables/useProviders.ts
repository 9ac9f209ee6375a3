import type { ProviderSummary } from '#shared/types/people'

/** Providers working at one site (or every provider in scope when siteId is null). */
export function useProviders(siteId: Ref<number | null>) {
  return useFetch<ProviderSummary[]>('/api/providers', {
    key: computed(() => `providers-${siteId.value ?? 'all'}`),
    query: computed(() => (siteId.value === null ? {} : { siteId: siteId.value })),
    watch: [siteId],
    default: () => [],
  })
}
