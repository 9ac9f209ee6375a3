// Visits of one site or one provider over a UTC range, kept fresh by polling GET /api/visits
// with its ETag (a 304 costs almost nothing), so other people's bookings and moves appear within a
// few seconds without reloading. The one polling mechanism for visits: the Chairboard (through
// useBoardVisits) and My day use it. Polls only while the tab is visible; `paused` holds them off
// (My day, while a state change it shows ahead of the server is on its way).
import type { BoardVisitDto } from '#shared/types/visits'
import type { VisitScope } from './useVisitList'
import type { UtcRange } from '#shared/utils/local-date'

export const VISIT_POLL_MS = 2_500

export function usePolledVisits(scope: Ref<VisitScope | null>, range: Ref<UtcRange>, options: { paused?: () => boolean } = {}) {
  const visits = ref<BoardVisitDto[]>([])
  const loading = ref(false)
  /** False until the current scope and range have been read once (so a screen can tell "loading" from "none"). */
  const loaded = ref(false)
  const error = ref<string | null>(null)
  let etag = ''
  let timer: ReturnType<typeof setInterval> | undefined

  const currentKey = () => `${JSON.stringify(scope.value)}|${range.value.fromUtc}|${range.value.toUtc}`

  async function load(force = false): Promise<void> {
    if (scope.value === null) { loaded.value = true; return }
    const key = currentKey()
    loading.value = visits.value.length === 0
    try {
      const response = await $fetch.raw<BoardVisitDto[]>('/api/visits', {
        query: { ...scope.value, fromUtc: range.value.fromUtc, toUtc: range.value.toUtc },
        headers: force || !etag ? {} : { 'if-none-match': etag },
        ignoreResponseError: true,
      })
      // A slow answer for a scope or range the screen has left must not overwrite the one it shows now.
      if (key !== currentKey()) return
      if (response.status === 200 && response._data) {
        visits.value = response._data
        etag = response.headers.get('etag') ?? ''
        error.value = null
        loaded.value = true
      } else if (response.status >= 400) {
        const data = response._data as unknown as { message?: string } | undefined
        error.value = data?.message ?? response.statusText ?? `status ${response.status}`
        loaded.value = true
      }
    } catch {
      // Offline for a moment: keep what is shown and try again on the next poll.
    } finally {
      loading.value = false
    }
  }

  watch(currentKey, () => { etag = ''; visits.value = []; loaded.value = false; void load(true) })
  onMounted(() => {
    void load(true)
    timer = setInterval(() => {
      if (document.visibilityState === 'visible' && !options.paused?.()) void load()
    }, VISIT_POLL_MS)
  })
  onBeforeUnmount(() => clearInterval(timer))

  return { visits, loading, loaded, error, reload: () => load(true) }
}
