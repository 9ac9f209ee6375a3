// Reading a webhook call of the SMS service: a form-encoded body, checked with the SDK's
// validateRequest against the URL the service called (our public address + path and query) and the
// account's auth token. Anything else is 403 before a handler acts on it.
import type { H3Event } from 'h3'
import { isSignedByService } from './sms-client'

const FORM = /^application\/x-www-form-urlencoded\s*(?:;|$)/i
const MAX_PARAMS = 100
const MAX_VALUE = 2000

function refused() {
  return createError({ statusCode: 403, statusMessage: 'Forbidden', message: 'This request is not signed by the SMS service.' })
}

export async function readSignedWebhook(event: H3Event): Promise<Record<string, string>> {
  if (!FORM.test(getRequestHeader(event, 'content-type') ?? '')) throw refused()
  const raw = (await readRawBody(event, 'utf8')) ?? ''
  const params: Record<string, string> = {}
  let count = 0
  for (const [key, value] of new URLSearchParams(raw)) {
    count += 1
    if (count > MAX_PARAMS || value.length > MAX_VALUE) throw refused()
    params[key] = value
  }
  if (!isSignedByService(getRequestHeader(event, 'x-twilio-signature'), event.path, params)) throw refused()
  return params
}
