// Security headers on pages and API responses (OWASP Secure Headers Project; OWASP ASVS 4.0.3 V14.4.3–V14.4.7;
// CSP Level 3 for the nonce; RFC 7034 for X-Frame-Options).
import { describe, expect, it } from 'vitest'
import { ApiClient } from '../helpers/api-client'

function expectCommonHeaders(headers: Headers, referrerPolicy = 'same-origin') {
  expect(headers.get('x-content-type-options')).toBe('nosniff') // ASVS V14.4.4
  expect(headers.get('x-frame-options')).toBe('DENY') // ASVS V14.4.7 (with frame-ancestors)
  expect(headers.get('referrer-policy')).toBe(referrerPolicy) // ASVS V14.4.6
  expect(headers.get('permissions-policy')).toMatch(/camera=\(\)/)
  expect(headers.get('content-security-policy')).toMatch(/frame-ancestors 'none'/) // ASVS V14.4.3
}

describe('security headers', () => {
  it('sends a nonce-based Content-Security-Policy with the sign-in page, and the nonce on its scripts', async () => {
    const response = await fetch(new URL('/sign-in', new ApiClient().baseURL))
    expect(response.status).toBe(200)
    expectCommonHeaders(response.headers)
    const policy = response.headers.get('content-security-policy')!
    const nonce = /script-src 'self' 'nonce-([A-Za-z0-9+/=]+)'/.exec(policy)?.[1]
    expect(nonce).toBeTruthy()
    expect(policy).toContain("default-src 'self'")
    expect(policy).toContain("object-src 'none'")
    expect(policy).not.toContain('unsafe-eval')
    expect(policy).not.toMatch(/script-src[^;]*unsafe-inline/)
    const html = await response.text()
    const scripts = html.match(/<script\b[^>]*>/g) ?? []
    expect(scripts.length).toBeGreaterThan(0)
    for (const tag of scripts) expect(tag).toContain(`nonce="${nonce}"`)
    // A fresh nonce for every response.
    const again = await fetch(new URL('/sign-in', new ApiClient().baseURL))
    expect(again.headers.get('content-security-policy')).not.toBe(policy)
  })

  it('sends the headers with API answers, errors included, with a policy that allows nothing', async () => {
    const client = new ApiClient()
    await client.signIn('manager@fernhollow.test')
    const sites = await client.get('/api/sites')
    expect(sites.status).toBe(200)
    expectCommonHeaders(sites.headers)
    expect(sites.headers.get('content-security-policy')).toMatch(/^default-src 'none'/)

    // Error answers come from Nitro's error handler, whose own headers are stricter still: no referrer
    // at all, and a policy that forbids every script and any framing. Ours add the Permissions-Policy.
    const signedOut = await new ApiClient().get('/api/me')
    expect(signedOut.status).toBe(401)
    expectCommonHeaders(signedOut.headers, 'no-referrer')
    expect(signedOut.headers.get('content-security-policy')).toMatch(/script-src 'none'/)
  })
})
