// Visits of one site day for the Chairboard: usePolledVisits over the site's local day.
import { siteDayRange } from '#shared/utils/board-columns'
import { usePolledVisits } from './usePolledVisits'

export function useBoardVisits(siteId: Ref<number | null>, date: Ref<string>, zone: Ref<string>) {
  const scope = computed(() => (siteId.value === null ? null : { siteId: siteId.value }))
  const range = computed(() => siteDayRange(date.value, zone.value))
  const { visits, loading, reload } = usePolledVisits(scope, range)
  return { visits, loading, reload }
}
