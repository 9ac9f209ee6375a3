// The signed-in user as the visit rules (shared/domain/visit-access.ts) see them: role, sites and
// their own provider record. Screens ask those rules what to offer; the server asks them again.
import type { VisitActor } from '#shared/domain/visit-access'

export function useVisitActor() {
  const session = useSessionStore()
  const { data: providers } = useProviders(ref(null))
  return computed<VisitActor | null>(() => {
    const user = session.user
    if (!user) return null
    const own = (providers.value ?? []).find((provider) => provider.userId === user.id)
    return { role: user.role, allSites: user.allSites, siteIds: user.siteIds, providerId: own?.id ?? null }
  })
}
