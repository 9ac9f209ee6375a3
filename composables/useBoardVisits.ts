// Visits of one site day, kept fresh by polling with ETags (a 304 costs almost nothing), so other
// people's bookings appear within a few seconds without reloading.
import type { BoardVisitDto } from '#shared/types/appointments'
import { localDayRange } from '#shared/utils/local-date'

const POLL_MS = 2_500

export function useBoardVisits(siteId: Ref<number | null>, date: Ref<string>, zone: Ref<string>) {
  const visits = ref<BoardVisitDto[]>([])
  const loading = ref(false)
  let etag = ''
  let timer: ReturnType<typeof setInterval> | undefined

  const currentKey = () => `${siteId.value}|${date.value}|${zone.value}`

  async function load(force = false): Promise<void> {
    if (siteId.value === null) return
    const key = currentKey()
    const { from, to } = localDayRange(date.value, zone.value)
    loading.value = visits.value.length === 0
    try {
      const response = await $fetch.raw<BoardVisitDto[]>('/api/appointments', {
        query: { siteId: siteId.value, from, to },
        headers: force || !etag ? {} : { 'if-none-match': etag },
        ignoreResponseError: true,
      })
      // A slow answer for a day the board has left must not overwrite the day it shows now.
      if (key !== currentKey()) return
      if (response.status === 200 && response._data) {
        visits.value = response._data
        etag = response.headers.get('etag') ?? ''
      }
    } finally {
      loading.value = false
    }
  }

  watch([siteId, date], () => { etag = ''; visits.value = []; void load(true) })
  onMounted(() => {
    void load(true)
    timer = setInterval(() => { if (document.visibilityState === 'visible') void load() }, POLL_MS)
  })
  onBeforeUnmount(() => clearInterval(timer))

  return { visits, loading, reload: () => load(true) }
}
