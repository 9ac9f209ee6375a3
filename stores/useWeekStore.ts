// Which week, provider and chair the week views show; kept while moving between the provider
// week and the operatory week.
import { defineStore } from 'pinia'
import { addDays, mondayOf } from '#shared/utils/local-date'

export const useWeekStore = defineStore('week', () => {
  /** Monday of the week shown, a local date. Null until a page sets it from its site's today. */
  const weekStart = ref<string | null>(null)
  const providerId = ref<number | null>(null)
  const operatoryId = ref<number | null>(null)

  function showWeekOf(date: string): void {
    weekStart.value = mondayOf(date)
  }

  function moveWeeks(count: number): void {
    if (weekStart.value) weekStart.value = addDays(weekStart.value, 7 * count)
  }

  return { weekStart, providerId, operatoryId, showWeekOf, moveWeeks }
})
