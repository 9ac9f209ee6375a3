// A patient's page behind a signed e-mail link (a waitlist offer, a move offer): no sign-in, the
// page's facts read from `/api/<kind>/<token>`, shown in the site's clock and date order, and one
// answer posted to `/api/<kind>/<token>/<action>`. When an answer is refused the reason is kept in
// `problem` and the facts are read again, so the page shows what holds now (taken, expired…).
import type { Ref } from 'vue'
import type { DisplayStyle, PublicSiteFacts } from '#shared/types/display'
import { apiErrorMessage } from '#shared/utils/api-errors'

export async function usePatientLinkPage<T extends PublicSiteFacts, Action extends string>(kind: 'offer' | 'move-offer') {
  const route = useRoute()
  const token = computed(() => String(route.params.token ?? ''))
  const path = computed(() => `/api/${kind}/${encodeURIComponent(token.value)}`)
  const { data, error } = await useFetch<T>(path, { key: `${kind}-${token.value}` })
  const facts = data as Ref<T | undefined>
  const busy = ref(false)
  const problem = ref('')
  const failure = computed(() => (error.value ? 'This link is not valid. It may have been copied incompletely.' : ''))
  const style = computed<DisplayStyle>(() => ({ timeZone: facts.value?.timeZone ?? 'UTC', clock: facts.value?.clock ?? '12h', dateOrder: facts.value?.dateOrder ?? 'month-day-year' }))

  // Nitro types $fetch by route; these routes are known only by kind, so read the answer as T.
  const fetchFacts = (url: string, method: 'GET' | 'POST' = 'GET') => $fetch(url, { method }) as unknown as Promise<T>

  async function answer(action: Action): Promise<void> {
    busy.value = true
    problem.value = ''
    try {
      facts.value = await fetchFacts(`${path.value}/${action}`, 'POST')
    } catch (caught) {
      problem.value = apiErrorMessage(caught, 'That did not work. Please call the practice.')
      facts.value = await fetchFacts(path.value).catch(() => facts.value)
    } finally {
      busy.value = false
    }
  }

  return { facts, failure, style, busy, problem, answer }
}
