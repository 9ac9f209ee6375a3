// Cross-site request forgery defence (OWASP: verifying origin with standard headers).
// A state-changing request whose Origin (or, lacking it, Referer) names another origin is refused.
// Origins are compared whole: scheme, host and port (RFC 6454 §5), so https://host:3000 is not
// http://host:3000. Requests with neither header (scripts, integrations) pass; SameSite=Lax cookies
// cover browsers.
import { MESSAGES } from '../utils/errors'

const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])

function originOf(value: string): string | null {
  try {
    const origin = new URL(value).origin
    return origin === 'null' ? null : origin
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
  const trustProxy = Boolean(auth.trustProxy)
  const own = originOf(`${getRequestProtocol(event, { xForwardedProto: trustProxy })}://${getRequestHost(event, { xForwardedHost: trustProxy })}`)
  const allowed = String(auth.allowedOrigins || '')
    .split(',')
    .map((entry) => originOf(entry.trim()))
    .filter(Boolean)
  if (claimed && (claimed === own || allowed.includes(claimed))) return

  throw createError({ statusCode: 403, statusMessage: 'Forbidden', message: MESSAGES.foreignOrigin })
})
