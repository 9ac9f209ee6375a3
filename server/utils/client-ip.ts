import type { H3Event } from 'h3'

/** X-Forwarded-For is trusted only behind a proxy we configured, or anyone could pick their IP. */
export function clientIp(event: H3Event): string {
  const { auth } = useRuntimeConfig()
  return getRequestIP(event, { xForwardedFor: Boolean(auth.trustProxy) }) ?? 'unknown'
}
