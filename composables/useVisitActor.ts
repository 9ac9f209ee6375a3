// The signed-in user as the visit rules (shared/domain/visit-access.ts) see them: role, sites and
// their own provider record. Screens ask those rules what to offer; the server asks them again.
// The provider id is looked up once per signed-in user (useState, shared by every component).
import type { VisitActor } from '#shared/domain/visit-access'
import { hasRole, ROLE_GROUPS } from '#shared/utils/access'
import type { ProviderSummary } from '#shared/types/people'

export function useVisitActor() {
  const session = useSessionStore()
  const own = useState<{ userId: number; providerId: number | null } | null>('visit-actor-provider', () => null)
  const lookUp = async (userId: number) => {
    if (own.value?.userId === userId) return
    own.value = { userId, providerId: null }
    if (!hasRole(session.user, ROLE_GROUPS.providers)) return
    const providers = await $fetch<ProviderSummary[]>('/api/providers').catch(() => [])
    if (own.value?.userId === userId) own.value = { userId, providerId: providers.find((provider) => provider.userId === userId)?.id ?? null }
  }
  if (import.meta.client) watch(() => session.user?.id, (userId) => { if (userId !== undefined) void lookUp(userId) }, { immediate: true })
  return computed<VisitActor | null>(() => {
    const user = session.user
    if (!user) return null
    return { role: user.role, allSites: user.allSites, siteIds: user.siteIds, providerId: own.value?.userId === user.id ? own.value.providerId : null }
  })
}
