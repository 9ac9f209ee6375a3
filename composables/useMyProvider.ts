// The provider record of the signed-in dentist or hygienist (null for everyone else). Awaited by
// pages, so what depends on the provider id is fetched with it already known, on the server too.
import type { ProviderSummary } from '#shared/types/people'

export async function useMyProvider() {
  const session = useSessionStore()
  const { data: providers } = await useProviders(ref(null))
  const provider = computed<ProviderSummary | null>(() => (providers.value ?? []).find((entry) => entry.userId === session.user?.id) ?? null)
  return { provider, providers }
}
