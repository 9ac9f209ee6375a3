// Security headers on every response (OWASP Secure Headers Project; OWASP ASVS 4.0.3 V14.4).
// Pages get a Content-Security-Policy with a fresh nonce per response: Nuxt's one inline script
// (window.__NUXT__ config) and its module scripts carry the nonce; every other script must come from
// this origin. Styles allow 'unsafe-inline' because Vue renders style attributes and FullCalendar
// injects its own <style> element at run time. Fonts ship with the app (@fontsource), so nothing is
// loaded from anywhere else. Anything that is not a page (API JSON, files) gets a policy that allows nothing.
import { randomBytes } from 'node:crypto'
import type { H3Event } from 'h3'

const PAGE_POLICY = (nonce: string) => [
  "default-src 'self'",
  `script-src 'self' 'nonce-${nonce}'`,
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self' data:",
  "connect-src 'self'",
  "object-src 'none'",
  "base-uri 'self'",
  "form-action 'self'",
  "frame-ancestors 'none'",
].join('; ')

const OTHER_POLICY = "default-src 'none'; frame-ancestors 'none'; base-uri 'none'; form-action 'none'"

const COMMON: Record<string, string> = {
  'X-Content-Type-Options': 'nosniff',
  'X-Frame-Options': 'DENY',
  // Nothing (such as a patient's /visit/<token> address) leaks to other sites, while same-origin
  // requests keep the Referer the origin check falls back on when a request has no Origin.
  'Referrer-Policy': 'same-origin',
  'Permissions-Policy': 'camera=(), microphone=(), geolocation=(), payment=(), usb=(), display-capture=()',
  'Cross-Origin-Opener-Policy': 'same-origin',
}

function setCommonHeaders(event: H3Event): void {
  for (const [name, value] of Object.entries(COMMON)) setResponseHeader(event, name, value)
  setResponseHeader(event, 'Content-Security-Policy', OTHER_POLICY)
  const { auth } = useRuntimeConfig()
  if (getRequestProtocol(event, { xForwardedProto: Boolean(auth.trustProxy) }) === 'https') {
    setResponseHeader(event, 'Strict-Transport-Security', 'max-age=31536000')
  }
}

const SCRIPT_WITHOUT_NONCE = /<script\b(?![^>]*\snonce=)/gi

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('request', (event) => {
    setCommonHeaders(event)
  })

  nitroApp.hooks.hook('render:html', (html, { event }) => {
    const nonce = randomBytes(16).toString('base64')
    const addNonce = (parts: string[]) => parts.map((part) => part.replace(SCRIPT_WITHOUT_NONCE, `<script nonce="${nonce}"`))
    html.head = addNonce(html.head)
    html.bodyPrepend = addNonce(html.bodyPrepend)
    html.body = addNonce(html.body)
    html.bodyAppend = addNonce(html.bodyAppend)
    setResponseHeader(event, 'Content-Security-Policy', PAGE_POLICY(nonce))
  })
})
