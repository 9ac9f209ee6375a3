// The unsealed session per sealed cookie value (issue 19 §3): unsealing derives its keys through Web
// Crypto on every request, about a tenth of the app's CPU on the booking path. A cookie seen in the
// last SESSION_CACHE.ttlMs is read from here instead. It only saves the decryption: the session guard
// still checks every request against the database (account active, session version, idle time and
// age from the session's own data), so a signed-out, revoked or deactivated session is refused as
// before. An entry never outlives the seal's own expiry or the session's maxAge, the cookie is the
// whole key (a changed cookie is a miss), and signing out drops the cookie's entry at once.
import type { H3Event } from 'h3'

export const SESSION_CACHE = { maxEntries: 2_000, ttlMs: 30_000 } as const

interface Unsealed { id: string; createdAt: number; data: Record<string, unknown> }
interface Entry { session: Unsealed; expiresAtMs: number }

const entries = new Map<string, Entry>()

/** The session cookie's name (nuxt-auth-utils' default unless configured). */
export function sessionName(): string {
  return String(useRuntimeConfig().session?.name || 'nuxt-session')
}

/** The sealed value h3 would unseal for this request: the `x-<name>-session` header, else the cookie. */
export function sealedSessionOf(event: H3Event): string | undefined {
  const name = sessionName()
  const headers = event.node.req.headers
  const header = headers[`x-${name.toLowerCase()}-session`]
  if (typeof header === 'string' && header) return header
  const cookie = headers.cookie
  if (!cookie) return undefined
  for (const pair of cookie.split(';')) {
    const at = pair.indexOf('=')
    if (at > 0 && pair.slice(0, at).trim() === name) {
      const value = pair.slice(at + 1).trim()
      try {
        return decodeURIComponent(value)
      } catch {
        return value
      }
    }
  }
  return undefined
}

/** The seal's expiry (iron's `Fe26.2*id*salt*iv*data*expiry*hmacSalt*hmac`, covered by its HMAC once unsealed); 0 when it has none. */
function sealExpiryMs(sealed: string): number {
  const expiry = Number(sealed.split('*')[5])
  return Number.isFinite(expiry) && expiry > 0 ? expiry : 0
}

/**
 * Puts a cached copy of the unsealed session on the event where h3 looks first, so the next
 * getUserSession() of this request does not unseal; false when the cookie is not cached.
 */
export function restoreCachedSession(event: H3Event, sealed: string, nowMs = Date.now()): boolean {
  const entry = entries.get(sealed)
  if (!entry) return false
  entries.delete(sealed)
  if (entry.expiresAtMs <= nowMs) return false
  entries.set(sealed, entry) // most recently used last
  const sessions = (event.context.sessions ??= Object.create(null)) as Record<string, Unsealed>
  const { session } = entry
  sessions[sessionName()] = { id: session.id, createdAt: session.createdAt, data: structuredClone(session.data) }
  return true
}

/** Remembers a session h3 just unsealed from this cookie (a signed-in one only). */
export function rememberSession(sealed: string, session: Unsealed, nowMs = Date.now()): void {
  const maxAgeSeconds = Number(useRuntimeConfig().session?.maxAge ?? 0)
  const limits = [nowMs + SESSION_CACHE.ttlMs]
  const sealExpiry = sealExpiryMs(sealed)
  if (sealExpiry) limits.push(sealExpiry)
  if (maxAgeSeconds > 0) limits.push(session.createdAt + maxAgeSeconds * 1000)
  const expiresAtMs = Math.min(...limits)
  if (expiresAtMs <= nowMs) return
  entries.delete(sealed)
  entries.set(sealed, { session: { id: session.id, createdAt: session.createdAt, data: structuredClone(session.data) }, expiresAtMs })
  while (entries.size > SESSION_CACHE.maxEntries) entries.delete(entries.keys().next().value!)
}

/** Drops a cookie's entry (it was refused, or its user signed out). */
export function forgetCachedSession(sealed: string | undefined): void {
  if (sealed) entries.delete(sealed)
}
