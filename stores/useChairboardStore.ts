// The Chairboard's shared state: which day is shown, which visit is selected, and the booking
// drawer (open, and the slot it was opened from).
import { defineStore } from 'pinia'
import { addDays, todayIn } from '#shared/utils/local-date'

export interface DrawerSlot {
  operatoryId: number | null
  startUtc: string | null
}

export const useChairboardStore = defineStore('chairboard', () => {
  const session = useSessionStore()
  const zone = computed(() => session.selectedSite?.timeZone ?? 'UTC')
  const date = ref<string>(todayIn(zone.value))
  const selectedVisitId = ref<number | null>(null)
  const drawerOpen = ref(false)
  const drawerSlot = ref<DrawerSlot>({ operatoryId: null, startUtc: null })
  const notice = ref<{ kind: 'error' | 'info'; text: string } | null>(null)

  function goToday() { date.value = todayIn(zone.value) }
  function step(days: number) { date.value = addDays(date.value, days) }
  function openDrawer(slot: DrawerSlot) {
    drawerSlot.value = slot
    drawerOpen.value = true
  }
  function closeDrawer() { drawerOpen.value = false }
  function tell(kind: 'error' | 'info', text: string) { notice.value = { kind, text } }

  return { date, selectedVisitId, drawerOpen, drawerSlot, notice, zone, goToday, step, openDrawer, closeDrawer, tell }
})
