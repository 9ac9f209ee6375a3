// The selected site's Rebook list (glossary): visits stranded by a change, waiting for a new time.
// Shared by the Rebook screen and the navigation's count; read again on a site change, on every
// navigation and after each move or cancel from the list (no timer of its own).
import { defineStore } from 'pinia'
import type { RebookEntry, RebookList } from '#shared/types/rebook'

export const useRebookStore = defineStore('rebook', () => {
  const siteId = ref<number | null>(null)
  const visits = ref<RebookEntry[]>([])
  const loaded = ref(false)
  const count = computed(() => visits.value.length)

  async function refresh(forSiteId: number | null): Promise<void> {
    siteId.value = forSiteId
    if (forSiteId === null) {
      visits.value = []
      return
    }
    try {
      const list = await $fetch<RebookList>('/api/rebook', { query: { siteId: forSiteId } })
      if (siteId.value === forSiteId) visits.value = list.visits
    } catch {
      // A role without the list, or a passing network error: the count stays as it was.
    }
    loaded.value = true
  }

  return { siteId, visits, loaded, count, refresh }
})
