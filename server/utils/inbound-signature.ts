// The inbound-mail webhook's signature, as hosted inbound-mail services sign their posts: HMAC-SHA256
// with the shared secret (NUXT_MAIL_INBOUND_SECRET) over `<delivery id>.<unix seconds>.<raw body>`,
// sent hex-encoded in X-Cuspline-Inbound-Signature beside X-Cuspline-Inbound-Id and
// X-Cuspline-Inbound-Timestamp. Checked in constant time; a timestamp more than five minutes off is a
// replay (the seen delivery id is refused by the service). scripts/mail-catcher.ts signs the same way.
import { createHmac, timingSafeEqual } from 'node:crypto'

export const INBOUND_HEADERS = {
  id: 'x-cuspline-inbound-id',
  timestamp: 'x-cuspline-inbound-timestamp',
  signature: 'x-cuspline-inbound-signature',
  recipient: 'x-cuspline-inbound-recipient',
} as const

export const INBOUND_TOLERANCE_SECONDS = 300

export function inboundSignature(secret: string, id: string, timestamp: string, body: Buffer): string {
  return createHmac('sha256', secret).update(`${id}.${timestamp}.`).update(body).digest('hex')
}

export interface InboundSignedParts {
  id: string | undefined
  timestamp: string | undefined
  signature: string | undefined
}

/** True when the post is signed with the secret, and recent. */
export function isValidInboundSignature(secret: string, parts: InboundSignedParts, body: Buffer, nowMs = Date.now()): boolean {
  const { id, timestamp, signature } = parts
  if (secret.length < 32 || !id || !timestamp || !signature) return false
  if (!/^[\w.:-]{1,100}$/.test(id) || !/^\d{1,12}$/.test(timestamp)) return false
  if (Math.abs(nowMs / 1000 - Number(timestamp)) > INBOUND_TOLERANCE_SECONDS) return false
  const expected = Buffer.from(inboundSignature(secret, id, timestamp, body), 'utf8')
  const given = Buffer.from(signature.trim().toLowerCase(), 'utf8')
  // timingSafeEqual needs equal lengths; comparing against itself keeps the time the same either way.
  return timingSafeEqual(expected, given.length === expected.length ? given : expected) && given.length === expected.length
}
