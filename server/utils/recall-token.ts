// Signed recall-page links: "<recallId>.<siteId>.<expiresSeconds>.<HMAC-SHA256>" (base64url), the same
// shape and the same patient-link secret as the visit links (visit-token.ts). The HMAC covers the
// recall, the site whose openings the page lists, the patient, the due date the e-mail was about and
// the expiry: a token opens one recall at one site, cannot be edited, stops working when the link
// expires, and stops matching once a finished visit sets a new due date. No framework imports: tests
// sign tokens with it too.
import { createHmac, timingSafeEqual } from 'node:crypto'
import { MAX_ID } from '../../shared/domain/input-bounds'

interface RecallTokenFacts {
  recallId: number
  siteId: number
  patientId: number
  dueDate: string
}

function signature(secret: string, facts: RecallTokenFacts, expiresSeconds: number): string {
  return createHmac('sha256', secret).update(`cuspline-recall:${facts.recallId}:${facts.siteId}:${facts.patientId}:${facts.dueDate}:${expiresSeconds}`).digest('base64url')
}

export function signRecallToken(secret: string, facts: RecallTokenFacts, expiresAtMs: number): string {
  const expiresSeconds = Math.ceil(expiresAtMs / 1000)
  return `${facts.recallId}.${facts.siteId}.${expiresSeconds}.${signature(secret, facts, expiresSeconds)}`
}

/** The claimed recall, site and expiry, before the signature is checked (that needs the recall row). */
export function readRecallToken(token: string): { recallId: number; siteId: number; expiresSeconds: number; expiresAtMs: number } | null {
  const match = /^(\d{1,10})\.(\d{1,10})\.(\d{1,12})\.([A-Za-z0-9_-]{43})$/.exec(token)
  if (!match) return null
  const recallId = Number(match[1])
  const siteId = Number(match[2])
  if (recallId < 1 || recallId > MAX_ID || siteId < 1 || siteId > MAX_ID) return null
  return { recallId, siteId, expiresSeconds: Number(match[3]), expiresAtMs: Number(match[3]) * 1000 }
}

export function recallSignatureValid(secret: string, token: string, facts: Omit<RecallTokenFacts, 'recallId' | 'siteId'>): boolean {
  const parts = readRecallToken(token)
  if (!parts) return false
  const expected = Buffer.from(signature(secret, { recallId: parts.recallId, siteId: parts.siteId, ...facts }, parts.expiresSeconds))
  const given = Buffer.from(token.slice(token.lastIndexOf('.') + 1))
  return expected.length === given.length && timingSafeEqual(expected, given)
}
