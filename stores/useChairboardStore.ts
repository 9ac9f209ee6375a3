// The Chairboard's shared state: which day is shown, which visit is selected, and the booking
// drawer (open, and the slot it was opened from).
import { defineStore } from 'pinia'
import { addDays, todayIn } from '#shared/utils/local-date'
import type { DraftItem } from '~/composables/useVisitPlanPreview'

export interface DrawerSlot {
  operatoryId: number | null
  startUtc: string | null
}

/** What "Book the next visit" hands the drawer: the patient and the procedures to plan (issue 13 §3). */
export interface DrawerPrefill {
  patientId: number
  items: DraftItem[]
}

/** A cancelled visit's time, or a slot a visit moved out of. */
export type FreedTime = { visitId: number } | { siteId: number; operatoryId: number; startUtc: string; endUtc: string }

export const useChairboardStore = defineStore('chairboard', () => {
  const session = useSessionStore()
  const zone = computed(() => session.selectedSite?.timeZone ?? 'UTC')
  const date = ref<string>(todayIn(zone.value))
  const selectedVisitId = ref<number | null>(null)
  const drawerOpen = ref(false)
  const drawerSlot = ref<DrawerSlot>({ operatoryId: null, startUtc: null })
  const drawerPrefill = ref<DrawerPrefill | null>(null)
  const notice = ref<{ kind: 'error' | 'info'; text: string } | null>(null)
  /**
   * Chair time just freed here (a visit cancelled, or moved out of its slot): shown with the waitlist
   * entries that fit it (issue 17).
   */
  const freed = ref<FreedTime | null>(null)

  function goToday() { date.value = todayIn(zone.value) }
  function step(days: number) { date.value = addDays(date.value, days) }
  function openDrawer(slot: DrawerSlot, prefill: DrawerPrefill | null = null) {
    drawerSlot.value = slot
    drawerPrefill.value = prefill
    drawerOpen.value = true
  }
  function closeDrawer() { drawerOpen.value = false }
  function tell(kind: 'error' | 'info', text: string) { notice.value = { kind, text } }

  return { date, selectedVisitId, freed, drawerOpen, drawerSlot, drawerPrefill, notice, zone, goToday, step, openDrawer, closeDrawer, tell }
})
