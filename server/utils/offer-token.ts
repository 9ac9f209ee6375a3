// Signed offer links: "<offerId>.<HMAC-SHA256>" (base64url) over the offer's id and its random nonce,
// with the patient-link secret. The offer row holds its own expiry, so the token carries none.
// No framework imports: tests sign tokens with it too.
import { createHmac, timingSafeEqual } from 'node:crypto'
import { MAX_ID } from '../../shared/domain/input-bounds'

/** What a link is for: a waitlist offer (`/offer/`) or a move offer (`/move-offer/`); one never opens the other. */
export type OfferLinkPurpose = 'offer' | 'move-offer'

function signature(secret: string, offerId: number, nonce: string, purpose: OfferLinkPurpose): string {
  return createHmac('sha256', secret).update(`cuspline-${purpose}:${offerId}:${nonce}`).digest('base64url')
}

export function signOfferToken(secret: string, offer: { id: number; nonce: string }, purpose: OfferLinkPurpose = 'offer'): string {
  return `${offer.id}.${signature(secret, offer.id, offer.nonce, purpose)}`
}

/** The claimed offer id, before the signature is checked (that needs the offer's nonce). */
export function readOfferToken(token: string): { offerId: number; signature: string } | null {
  const match = /^(\d{1,10})\.([A-Za-z0-9_-]{43})$/.exec(token)
  if (!match || Number(match[1]) > MAX_ID || Number(match[1]) < 1) return null
  return { offerId: Number(match[1]), signature: match[2]! }
}

export function offerSignatureValid(secret: string, token: string, nonce: string, purpose: OfferLinkPurpose = 'offer'): boolean {
  const parts = readOfferToken(token)
  if (!parts) return false
  const expected = Buffer.from(signature(secret, parts.offerId, nonce, purpose))
  const given = Buffer.from(parts.signature)
  return expected.length === given.length && timingSafeEqual(expected, given)
}
