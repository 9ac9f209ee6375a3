// Visits of one site day for the Chairboard: usePolledVisits over the site's local day.
import { localDayRange } from '#shared/utils/local-date'
import { usePolledVisits } from './usePolledVisits'

export function useBoardVisits(siteId: Ref<number | null>, date: Ref<string>, zone: Ref<string>) {
  const scope = computed(() => (siteId.value === null ? null : { siteId: siteId.value }))
  const range = computed(() => localDayRange(date.value, zone.value))
  const { visits, loading, reload } = usePolledVisits(scope, range)
  return { visits, loading, reload }
}
