// Who is signed in and which site they are looking at; shared by the shell and every page.
import { defineStore } from 'pinia'
import type { MeResponse, SessionUser, SiteSummary } from '#shared/types/auth'

export const useSessionStore = defineStore('session', () => {
  const user = ref<SessionUser | null>(null)
  const sites = ref<SiteSummary[]>([])
  const loaded = ref(false)
  // Kept in a cookie so the server renders the same site the browser last chose.
  const siteCookie = useCookie<number | null>('cuspline-site', { sameSite: 'lax', maxAge: 60 * 60 * 24 * 365 })

  const selectedSite = computed<SiteSummary | null>(
    () => sites.value.find((site) => site.id === siteCookie.value) ?? sites.value[0] ?? null,
  )

  async function load(): Promise<void> {
    const fetcher = useRequestFetch()
    try {
      const me = await fetcher<MeResponse>('/api/me')
      user.value = me.user
      sites.value = me.sites
    } catch {
      user.value = null
      sites.value = []
    }
    loaded.value = true
  }

  function selectSite(siteId: number): void {
    if (sites.value.some((site) => site.id === siteId)) siteCookie.value = siteId
  }

  async function signIn(email: string, password: string): Promise<void> {
    await $fetch('/api/auth/login', { method: 'POST', body: { email, password } })
    await load()
  }

  async function signOut(): Promise<void> {
    await $fetch('/api/auth/logout', { method: 'POST' }).catch(() => undefined)
    user.value = null
    sites.value = []
  }

  return { user, sites, loaded, selectedSite, load, selectSite, signIn, signOut }
})
