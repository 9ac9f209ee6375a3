// State-changing API routes read JSON only. A form-encoded (or any other) body is refused with 415
// before a handler sees it: a cross-site HTML form can send application/x-www-form-urlencoded,
// multipart/form-data or text/plain without a CORS preflight, but never application/json
// (Fetch standard, "CORS-safelisted request-header"), so this also backs the origin check.
// A request with no body (a sign-out, a confirm) may pass whatever its Content-Type says.
// The SMS service's webhooks post forms by design; they carry no cookie credential and are accepted
// only with the service's signature (server/utils/sms-webhook.ts), so a forged form gets nothing.
import { MESSAGES } from '../utils/errors'

const STATE_CHANGING = new Set(['POST', 'PUT', 'PATCH', 'DELETE'])
const SIGNED_FORM_ROUTES = new Set(['/api/sms/status', '/api/sms/inbound'])
const JSON_TYPE = /^application\/(?:[\w.+-]+\+)?json\s*(?:;|$)/i
// Two routes that outside senders post to in their own format: a mail client's one-click unsubscribe
// (RFC 8058 §3.1: a form body, no cookies, no Origin), and the inbound-mail webhook (a raw message,
// signed with the shared secret). Each reads nothing a form could forge.
const OWN_FORMATS: Array<[RegExp, RegExp]> = [
  [/^\/api\/visit\/[^/?]+\/reminders-off(?:\?|$)/, /^application\/x-www-form-urlencoded\s*(?:;|$)/i],
  [/^\/api\/inbound\/mail(?:\?|$)/, /^message\/rfc822\s*(?:;|$)/i],
]

function hasBody(headers: Record<string, string | string[] | undefined>): boolean {
  if (headers['transfer-encoding']) return true
  const length = Number(headers['content-length'] ?? 0)
  return !Number.isFinite(length) || length > 0
}

export default defineEventHandler((event) => {
  if (!STATE_CHANGING.has(event.method) || !event.path.startsWith('/api/')) return
  if (!hasBody(event.node.req.headers)) return
  if (SIGNED_FORM_ROUTES.has(event.path.split('?')[0]!)) return
  const type = getRequestHeader(event, 'content-type') ?? ''
  if (JSON_TYPE.test(type)) return
  if (OWN_FORMATS.some(([path, allowed]) => path.test(event.path) && allowed.test(type))) return
  throw createError({ statusCode: 415, statusMessage: 'Unsupported Media Type', message: MESSAGES.jsonOnly })
})
