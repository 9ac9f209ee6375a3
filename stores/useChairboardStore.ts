// The Chairboard's shared state: which day is shown, which visit is selected (and highlighted after a
// jump), whether cancelled visits show, the booking drawer (open, and the slot it was opened from), and
// the last outcome shown beside the board (a notice, optionally with a "show it" jump).
import { defineStore } from 'pinia'
import { addDays, todayIn } from '#shared/utils/local-date'
import { freedByChange, largestFreed } from '#shared/domain/freed-time'
import type { DraftItem } from '~/composables/useVisitPlanPreview'

export interface DrawerSlot {
  operatoryId: number | null
  startUtc: string | null
}

/** What "Book the next visit" hands the drawer: the patient and the procedures to plan (issue 13 §3). */
export interface DrawerPrefill {
  patientId: number
  items: DraftItem[]
  /** The provider of a found opening (Balance's suggestions): chosen when on the list. */
  providerId?: number
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

/**
 * A cancelled (or missed) visit's time; or a slot a visit moved out of, or a shortened visit's tail (one
 * chair); or a new shift's or extra day's window (no `operatoryId`: every chair of the site).
 */
export type FreedTime = { visitId: number } | { siteId: number; operatoryId?: number; startUtc: string; endUtc: string }

/** Where a visit sits in a chair, as the board and the API give it. */
interface VisitPlace { siteId: number; operatoryId: number; startUtc: string; endUtc: string }

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
  const drawerPrefill = ref<DrawerPrefill | null>(null)
  const notice = ref<BoardNotice | null>(null)
  let serial = 0
  /**
   * Chair time just freed here (a visit cancelled, or moved out of its slot): shown with the waitlist
   * entries that fit it (issue 17).
   */
  const freed = ref<FreedTime | null>(null)

  /** After a move or a change of length: the largest piece of chair time it gave up, if any, is shown as freed. */
  function noteFreed(before: VisitPlace, after: VisitPlace) {
    const span = (place: VisitPlace) => ({ siteId: place.siteId, operatoryId: place.operatoryId, startMs: Date.parse(place.startUtc), endMs: Date.parse(place.endUtc) })
    const part = largestFreed(freedByChange(span(before), span(after)))
    if (part) freed.value = { siteId: part.siteId, operatoryId: part.operatoryId, startUtc: new Date(part.startMs).toISOString(), endUtc: new Date(part.endMs).toISOString() }
  }

  function goToday() { date.value = todayIn(zone.value) }
  function step(days: number) { date.value = addDays(date.value, days) }
  function openDrawer(slot: DrawerSlot, prefill: DrawerPrefill | null = null) {
    drawerSlot.value = slot
    drawerPrefill.value = prefill
    drawerOpen.value = true
  }
  function closeDrawer() { drawerOpen.value = false }
  function tell(kind: 'error' | 'info', text: string, jump?: NoticeJump) { notice.value = { kind, text, jump, serial: ++serial } }
  function dismissNotice() { notice.value = null }

  return {
    date, selectedVisitId, highlightedVisitId, freed, showCancelled, drawerOpen, drawerSlot, drawerPrefill, notice, zone,
    goToday, step, openDrawer, closeDrawer, tell, dismissNotice, noteFreed,
  }
})
