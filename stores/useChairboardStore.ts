// The Chairboard's shared state: which day is shown, which visit is selected (and highlighted after a
// jump), whether cancelled visits show, the booking drawer (open, and the slot it was opened from), and
// the last outcome shown beside the board (a notice, optionally with a "show it" jump).
import { defineStore } from 'pinia'
import { addDays, todayIn } from '#shared/utils/local-date'

export interface DrawerSlot {
  operatoryId: number | null
  startUtc: string | null
}

/** Where a notice can take the user: a site's day with one visit highlighted. */
export interface NoticeJump {
  label: string
  siteId: number
  date: string
  visitId: number
}

export interface BoardNotice {
  kind: 'error' | 'info'
  text: string
  jump?: NoticeJump
  /** Counts up with every notice, so the same words said twice are announced twice. */
  serial: number
}

export const useChairboardStore = defineStore('chairboard', () => {
  const session = useSessionStore()
  const zone = computed(() => session.selectedSite?.timeZone ?? 'UTC')
  const date = ref<string>(todayIn(zone.value))
  const selectedVisitId = ref<number | null>(null)
  /** A visit the user jumped to from a notice: outlined on the board until another is chosen. */
  const highlightedVisitId = ref<number | null>(null)
  const showCancelled = ref(false)
  const drawerOpen = ref(false)
  const drawerSlot = ref<DrawerSlot>({ operatoryId: null, startUtc: null })
  const notice = ref<BoardNotice | null>(null)
  let serial = 0

  function goToday() { date.value = todayIn(zone.value) }
  function step(days: number) { date.value = addDays(date.value, days) }
  function openDrawer(slot: DrawerSlot) {
    drawerSlot.value = slot
    drawerOpen.value = true
  }
  function closeDrawer() { drawerOpen.value = false }
  function tell(kind: 'error' | 'info', text: string, jump?: NoticeJump) { notice.value = { kind, text, jump, serial: ++serial } }
  function dismissNotice() { notice.value = null }

  return {
    date, selectedVisitId, highlightedVisitId, showCancelled, drawerOpen, drawerSlot, notice, zone,
    goToday, step, openDrawer, closeDrawer, tell, dismissNotice,
  }
})
