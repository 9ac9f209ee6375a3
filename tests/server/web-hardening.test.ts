// Issue 11 §6: whole-origin CSRF check, JSON-only state-changing routes, and the session guard on
// nuxt-auth-utils' own session route.
import { afterAll, describe, expect, it } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, createTestUser } from '../helpers/db'

afterAll(closeTestDb)

const DEMO = { email: 'admin@fernhollow.test', password: 'cuspline-demo' }

describe('origin check compares scheme, host and port', () => {
  // RFC 6454 §5: two origins are the same only if scheme, host and port all match.
  it('refuses the same host and port over another scheme, and another port', async () => {
    const client = new ApiClient()
    const own = new URL(client.baseURL)
    const httpsTwin = `https://${own.host}`
    const otherPort = `${own.protocol}//${own.hostname}:${Number(own.port) + 1}`
    for (const origin of [httpsTwin, otherPort]) {
      const response = await client.post('/api/auth/login', DEMO, { headers: { origin } })
      expect(response.status, origin).toBe(403)
      expect(response.body.message).toBe('This request came from another web site and was refused.')
    }
    const byReferer = await client.post('/api/auth/login', DEMO, { headers: { referer: `${httpsTwin}/sign-in` } })
    expect(byReferer.status).toBe(403)
    expect(client.cookie).toBe('')
  })

  it('accepts the app\'s own origin', async () => {
    const client = new ApiClient()
    expect((await client.post('/api/auth/login', DEMO, { headers: { origin: client.baseURL } })).status).toBe(200)
  })
})

describe('state-changing API routes take JSON only', () => {
  async function send(path: string, contentType: string, body: string, cookie = '') {
    const response = await fetch(new URL(path, new ApiClient().baseURL), {
      method: 'POST', headers: { 'content-type': contentType, ...(cookie ? { cookie } : {}) }, body, redirect: 'manual',
    })
    const returned = response.headers.getSetCookie().map((line) => line.split(';')[0]).join('; ')
    return { status: response.status, text: await response.text(), cookie: returned }
  }

  it.each([
    ['application/x-www-form-urlencoded', `email=${encodeURIComponent(DEMO.email)}&password=${DEMO.password}`],
    ['multipart/form-data; boundary=x', `--x\r\ncontent-disposition: form-data; name="email"\r\n\r\n${DEMO.email}\r\n--x--\r\n`],
    ['text/plain', JSON.stringify(DEMO)],
  ])('refuses a %s sign-in with 415 and a plain message', async (type, body) => {
    const response = await send('/api/auth/login', type, body)
    expect(response.status).toBe(415)
    expect(JSON.parse(response.text).message).toBe('Send the request body as JSON (Content-Type: application/json).')
    // Whatever cookie came back holds no signed-in session.
    const after = new ApiClient()
    after.cookie = response.cookie
    expect((await after.get('/api/me')).status).toBe(401)
  })

  it('refuses a form body on a signed-in route before it changes anything', async () => {
    const user = await createTestUser({ password: 'a-long-test-password' })
    const client = new ApiClient()
    await client.signIn(user.email, user.password)
    const response = await send('/api/auth/logout', 'application/x-www-form-urlencoded', 'a=1', client.cookie)
    expect(response.status).toBe(415)
    expect((await client.get('/api/me')).status).toBe(200)
  })

  it('accepts JSON with a charset, and a request with no body', async () => {
    expect((await send('/api/auth/login', 'application/json; charset=utf-8', JSON.stringify(DEMO))).status).toBe(200)
    const client = await signedInAs('manager@fernhollow.test')
    const logout = await fetch(new URL('/api/auth/logout', client.baseURL), { method: 'POST', headers: { cookie: client.cookie } })
    expect(logout.status).toBe(200)
  })
})

describe('the session guard covers GET /api/_auth/session', () => {
  it('answers no user for a cookie replayed after sign-out', async () => {
    const user = await createTestUser()
    const client = new ApiClient()
    await client.signIn(user.email, user.password)
    const before = await client.get('/api/_auth/session')
    expect(before.status).toBe(200)
    expect(before.body.user.email).toBe(user.email)
    const stolen = client.cookie

    expect((await client.post('/api/auth/logout')).status).toBe(200)
    const replay = new ApiClient()
    replay.cookie = stolen
    const after = await replay.get('/api/_auth/session')
    expect(after.status).toBe(200)
    expect(after.body.user).toBeUndefined()
    expect(JSON.stringify(after.body)).not.toContain(user.email)
    // And nothing else takes the old cookie either.
    const again = new ApiClient()
    again.cookie = stolen
    expect((await again.get('/api/me')).status).toBe(401)
  })
})
