// Cross-site request forgery: state-changing requests from a foreign origin are refused
// (OWASP Cross-Site Request Forgery Prevention Cheat Sheet, "verifying origin with standard headers").
import { describe, expect, it } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'

const FOREIGN = { origin: 'http://attacker.test' }

describe('origin check', () => {
  it.each(['POST', 'PATCH', 'DELETE', 'PUT'])('refuses %s from a foreign Origin with 403', async (method) => {
    const client = await signedInAs('manager@fernhollow.test')
    const response = await client.request(method, '/api/auth/logout', { headers: FOREIGN, body: {} })
    expect(response.status).toBe(403)
    // The session survived: the forged request changed nothing.
    expect((await client.get('/api/me')).status).toBe(200)
  })

  it('refuses a foreign Referer when there is no Origin', async () => {
    const client = await signedInAs('manager@fernhollow.test')
    const response = await client.post('/api/auth/logout', {}, { headers: { referer: 'http://attacker.test/page' } })
    expect(response.status).toBe(403)
  })

  it('accepts the app\'s own origin and requests with neither header', async () => {
    const own = new ApiClient()
    const withOrigin = await own.post('/api/auth/login', { email: 'admin@fernhollow.test', password: 'cuspline-demo' }, { headers: { origin: own.baseURL } })
    expect(withOrigin.status).toBe(200)
    const script = await new ApiClient().post('/api/auth/login', { email: 'admin@fernhollow.test', password: 'cuspline-demo' })
    expect(script.status).toBe(200)
  })
})
