// One provider's Rota entries (shifts, extras, time off) for local dates from..to, keyed so that a
// provider known only after the first render still fetches.
import type { RotaView } from '#shared/types/rota-api'

export function useProviderRota(providerId: Ref<number | null>, from: Ref<string>, to: Ref<string>) {
  const fetcher = useRequestFetch()
  return useAsyncData<RotaView | null>(
    computed(() => `rota-provider-${providerId.value}-${from.value}-${to.value}`),
    (_nuxtApp, { signal }) => (providerId.value === null
      ? Promise.resolve(null)
      : fetcher<RotaView>('/api/rota', { query: { providerId: providerId.value, from: from.value, to: to.value }, signal })),
    { default: () => null },
  )
}
