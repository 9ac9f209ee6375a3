// Signed-out people go to sign-in; signed-in people only reach pages their role may use.
import { canOpenPath, homePathFor } from '#shared/utils/access'

const PUBLIC_PATHS = ['/sign-in']
// Patients open these from e-mail links: no sign-in, signed-in staff are not redirected.
const PUBLIC_PREFIXES = ['/visit/', '/offer/', '/move-offer/', '/recall-times/']

export default defineNuxtRouteMiddleware(async (to) => {
  if (PUBLIC_PREFIXES.some((prefix) => to.path.startsWith(prefix))) return
  const session = useSessionStore()
  if (!session.loaded) await session.load()
  const user = session.user

  if (PUBLIC_PATHS.includes(to.path)) {
    return user ? navigateTo(homePathFor(user.role)) : undefined
  }
  if (!user) {
    return navigateTo({ path: '/sign-in', query: to.fullPath === '/' ? {} : { next: to.fullPath } })
  }
  if (to.path === '/' || !canOpenPath(user.role, to.path)) {
    return navigateTo(homePathFor(user.role))
  }
})
