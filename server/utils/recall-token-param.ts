// A recall-page link token from the route; anything malformed is a 404 (the link is simply not valid).
import type { H3Event } from 'h3'
import { readRecallToken } from './recall-token'
import { notFound } from './errors'

export function recallTokenParam(event: H3Event): string {
  let token: string
  try {
    token = decodeURIComponent(getRouterParam(event, 'token') ?? '')
  } catch {
    throw notFound('This link is not valid. Please call the practice.')
  }
  if (!readRecallToken(token)) throw notFound('This link is not valid. Please call the practice.')
  return token
}
