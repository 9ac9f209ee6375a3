// Signed patient links: "<visitId>.<expiresSeconds>.<HMAC-SHA256>" (base64url). The HMAC covers
// the visit's id, its iCalendar UID and the expiry, so a token opens exactly one visit, cannot be
// edited, and stops working after the visit. No framework imports: tests sign tokens with it too.
import { createHmac, timingSafeEqual } from 'node:crypto'
import { MAX_ID } from '../../shared/domain/input-bounds'

export interface VisitTokenParts {
  visitId: number
  expiresAtMs: number
}

function signature(secret: string, visitId: number, icalUid: string, expiresSeconds: number): string {
  return createHmac('sha256', secret).update(`cuspline-visit:${visitId}:${icalUid}:${expiresSeconds}`).digest('base64url')
}

export function signVisitToken(secret: string, visit: { id: number; icalUid: string; expiresAtMs: number }): string {
  const expiresSeconds = Math.ceil(visit.expiresAtMs / 1000)
  return `${visit.id}.${expiresSeconds}.${signature(secret, visit.id, visit.icalUid, expiresSeconds)}`
}

/** The claimed visit and expiry, before the signature is checked (that needs the visit's UID). */
export function readVisitToken(token: string): (VisitTokenParts & { signature: string; expiresSeconds: number }) | null {
  const match = /^(\d{1,10})\.(\d{1,12})\.([A-Za-z0-9_-]{43})$/.exec(token)
  if (!match || Number(match[1]) > MAX_ID) return null
  return { visitId: Number(match[1]), expiresSeconds: Number(match[2]), expiresAtMs: Number(match[2]) * 1000, signature: match[3]! }
}

export function hasValidSignature(secret: string, token: string, icalUid: string): boolean {
  const parts = readVisitToken(token)
  if (!parts) return false
  const expected = Buffer.from(signature(secret, parts.visitId, icalUid, parts.expiresSeconds))
  const given = Buffer.from(parts.signature)
  return expected.length === given.length && timingSafeEqual(expected, given)
}
