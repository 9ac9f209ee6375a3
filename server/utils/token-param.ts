// A patient link token from the route; anything malformed is a 404 (the link is simply not valid).
import type { H3Event } from 'h3'
import { readVisitToken } from './visit-token'
import { notFound } from './errors'

export function tokenParam(event: H3Event): string {
  const token = decodeURIComponent(getRouterParam(event, 'token') ?? '')
  if (!readVisitToken(token)) throw notFound('This link is not valid. Please call the practice.')
  return token
}
