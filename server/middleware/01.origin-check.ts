// Cross-site request forgery defence (OWASP: verifying origin with standard headers).
// A state-changing request whose Origin (or, lacking it, Referer) names another origin is refused.
// Requests with neither header (scripts, integrations) pass; SameSite=Lax cookies cover browsers.
import { MESSAGES } from '../utils/errors'

const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

function originOf(value: string): string | null {
  try {
    return new URL(value).origin
  } catch {
    return null
  }
}

export default defineEventHandler((event) => {
  if (!STATE_CHANGING.has(event.method)) return
  const origin = getRequestHeader(event, 'origin')
  const referer = getRequestHeader(event, 'referer')
  const claimed = origin ? (origin === 'null' ? null : originOf(origin)) : referer ? originOf(referer) : undefined
  if (claimed === undefined) return

  // The global config (not the per-request copy, which re-reads the environment on every call).
  const { auth } = useRuntimeConfig()
  const ownHost = getRequestHost(event, { xForwardedHost: Boolean(auth.trustProxy) })
  const allowed = String(auth.allowedOrigins || '')
    .split(',')
    .map((entry) => entry.trim())
    .filter(Boolean)
  if (claimed && (new URL(claimed).host === ownHost || allowed.includes(claimed))) return

  throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: MESSAGES.foreignOrigin })
})
