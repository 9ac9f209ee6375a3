// Visits of one site day for the Chairboard: usePolledVisits over the site's local day, with the
// cancelled ones too when the board's "Show cancelled" is on.
import { localDayRange } from '#shared/utils/local-date'
import { usePolledVisits } from './usePolledVisits'

export function useBoardVisits(siteId: Ref<number | null>, date: Ref<string>, zone: Ref<string>, showCancelled: Ref<boolean> = ref(false)) {
  const scope = computed(() => (siteId.value === null ? null : { siteId: siteId.value, ...(showCancelled.value ? { includeCancelled: 'true' as const } : {}) }))
  const range = computed(() => localDayRange(date.value, zone.value))
  const { visits, loading, reload } = usePolledVisits(scope, range)
  return { visits, loading, reload }
}
