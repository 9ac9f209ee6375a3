// Runtime settings are checked once at start-up (server/plugins/00.runtime-config.ts): the built app,
// started with a wrong NUXT_* value, exits at once with a message naming the variable.
import { describe, expect, it } from 'vitest'
import { startAppServer } from '../helpers/app-server'

async function startFailure(env: Record<string, string>): Promise<string> {
  const server = await startAppServer({ NUXT_OUTBOX_DISPATCHER: 'false', ...env }).catch((error: Error) => error)
  if (!(server instanceof Error)) {
    await server.stop()
    throw new Error(`the app started with ${JSON.stringify(env)}`)
  }
  return server.message
}

describe('runtime config at start-up', () => {
  it('exits with code 1 naming the variable whose value is wrong', async () => {
    const message = await startFailure({ NUXT_DB_LOCK_WAIT_SECONDS: 'soon' })
    expect(message).toMatch(/exited early with code 1/)
    expect(message).toContain('NUXT_DB_LOCK_WAIT_SECONDS must be a number, 0 or more (got "soon")')
  })

  it('names every wrong variable, and never prints a secret', async () => {
    const message = await startFailure({ NUXT_AUTH_TRUST_PROXY: 'yes', NUXT_SMTP_PORT: '70000', NUXT_SESSION_PASSWORD: 'too-short-secret' })
    expect(message).toMatch(/exited early with code 1/)
    expect(message).toContain('NUXT_AUTH_TRUST_PROXY must be true or false (got "yes")')
    expect(message).toContain('NUXT_SMTP_PORT must be a whole number from 1 to 65535 (got 70000)')
    expect(message).toContain('NUXT_SESSION_PASSWORD must be at least 32 characters')
    expect(message).not.toContain('too-short-secret')
  })
})
