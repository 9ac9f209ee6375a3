// A patient link token from the route; anything malformed is a 404 (the link is simply not valid).
// That includes bad percent-encoding (`%ZZ`, a cut-off `%E0%A4%A`, an overlong `%C0%AE`): the
// decoder's URIError is the caller's mistake, never a 500.
import type { H3Event } from 'h3'
import { readVisitToken } from './visit-token'
import { notFound } from './errors'

const NOT_VALID = 'This link is not valid. Please call the practice.'

function decodeOrNull(raw: string): string | null {
  try {
    return decodeURIComponent(raw)
  } catch {
    return null
  }
}

export function tokenParam(event: H3Event): string {
  const token = decodeOrNull(getRouterParam(event, 'token') ?? '')
  if (token === null || !readVisitToken(token)) throw notFound(NOT_VALID)
  return token
}
