// The provider record of the signed-in dentist or hygienist (null for everyone else).
import type { ProviderSummary } from '#shared/types/people'

export function useMyProvider() {
  const session = useSessionStore()
  const { data: providers, pending } = useProviders(ref(null))
  const provider = computed<ProviderSummary | null>(() => (providers.value ?? []).find((entry) => entry.userId === session.user?.id) ?? null)
  return { provider, providers, pending }
}
