// A patient link token from the route (a visit link, a waitlist or move offer, a recall page);
// anything malformed is a 404 (the link is simply not valid). That includes bad percent-encoding
// (`%ZZ`, a cut-off `%E0%A4%A`, an overlong `%C0%AE`): the decoder's URIError is the caller's
// mistake, never a 500. Each kind's reader checks the token's shape; its service checks the signature.
import type { H3Event } from 'h3'
import { readVisitToken } from './visit-token'
import { readOfferToken } from './offer-token'
import { readRecallToken } from './recall-token'
import { notFound } from './errors'

const NOT_VALID = 'This link is not valid. Please call the practice.'

function decodeOrNull(raw: string): string | null {
  try {
    return decodeURIComponent(raw)
  } catch {
    return null
  }
}

function linkTokenParam(event: H3Event, wellFormed: (token: string) => unknown): string {
  const token = decodeOrNull(getRouterParam(event, 'token') ?? '')
  if (token === null || !wellFormed(token)) throw notFound(NOT_VALID)
  return token
}

/** A visit link (`/visit/<token>`). */
export function tokenParam(event: H3Event): string {
  return linkTokenParam(event, readVisitToken)
}

/** A waitlist offer or a move offer link (`/offer/<token>`, `/move-offer/<token>`). */
export function offerTokenParam(event: H3Event): string {
  return linkTokenParam(event, readOfferToken)
}

/** A recall page link (`/recall-times/<token>`). */
export function recallTokenParam(event: H3Event): string {
  return linkTokenParam(event, readRecallToken)
}
