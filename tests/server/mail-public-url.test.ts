// Issue 15 §1: a production server whose patient links would point at a loopback or plain-HTTP
// address says so at start-up (server/plugins/01.mail-public-url.ts). Own app servers, no bookings.
import { afterAll, describe, expect, it } from 'vitest'
import { startAppServer, type RunningServer } from '../helpers/app-server'

const servers: RunningServer[] = []
afterAll(async () => {
  await Promise.all(servers.map((server) => server.stop()))
})

describe('the public link address at start-up', () => {
  it('warns about a loopback address, and is quiet for an HTTPS address on a real host (OWASP ASVS 4.0.3 V9.1.1)', async () => {
    const env = { NUXT_OUTBOX_DISPATCHER: 'false' }
    const loopback = await startAppServer({ ...env, NUXT_MAIL_PUBLIC_URL: 'http://127.0.0.1:3000' })
    const real = await startAppServer({ ...env, NUXT_MAIL_PUBLIC_URL: 'https://visits.fernhollow.test' })
    servers.push(loopback, real)
    expect(loopback.output()).toMatch(/\[mail\].*NUXT_MAIL_PUBLIC_URL is http:\/\/127\.0\.0\.1:3000, a loopback address/)
    expect(real.output()).not.toMatch(/NUXT_MAIL_PUBLIC_URL/)
  })
})
