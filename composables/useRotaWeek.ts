// The Rota grid's week: which Monday, and the entries of one site or one provider for it.
import { DateTime } from 'luxon'
import type { RotaView } from '#shared/types/rota-api'
import { addDays, isoWeekdayOf } from '#shared/domain/recurrence'

export interface RotaScope {
  siteId?: number
  providerId?: number
}

export function mondayOf(date: string): string {
  return addDays(date, 1 - isoWeekdayOf(date))
}

/** Today on the site's wall clock (never the browser's own zone). */
export function todayIn(zone: string): string {
  return DateTime.now().setZone(zone).toISODate() ?? DateTime.utc().toISODate()!
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
