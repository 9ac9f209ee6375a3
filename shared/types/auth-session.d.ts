// Shapes that nuxt-auth-utils keeps in the sealed session cookie.
import type { SessionUser } from './auth'

declare module '#auth-utils' {
  interface User extends SessionUser {}
  interface UserSession {
    /** Compared with users.session_version on every API call, so a cookie can be revoked. */
    sessionVersion: number
    signedInAt: number
    lastSeenAt: number
  }
}

export {}
