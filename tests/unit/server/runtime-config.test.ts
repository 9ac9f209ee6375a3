// The runtime settings' checks (server/utils/runtime-config.ts) on plain objects shaped like
// nuxt.config's runtimeConfig after NUXT_* overrides (numbers and booleans already parsed).
import { readFileSync } from 'node:fs'
import { resolve } from 'node:path'
import { describe, expect, it } from 'vitest'
import { envNameOf, runtimeConfigProblems } from '../../../server/utils/runtime-config'

const SECRET = 'x'.repeat(32)
function config() {
  return {
    db: { host: '127.0.0.1', port: 3307, user: 'cuspline', password: 'pw', database: 'cuspline', lockWaitSeconds: 5 },
    auth: {
      idleMinutes: 30, absoluteHours: 12, accountAddressFailureLimit: 10, ipFailureLimit: 100, failureWindowMinutes: 15,
      delayFreeFailures: 3, delayBaseMs: 250, delayMaxMs: 3000, trustProxy: false, allowedOrigins: '',
    },
    session: { password: SECRET, maxAge: 43200, cookie: { sameSite: 'lax', httpOnly: true, secure: true }, name: 'nuxt-session' },
    smtp: { host: '127.0.0.1', port: 1025, secure: false, user: '', password: '', from: '' },
    mail: { linkSecret: SECRET, publicUrl: 'http://127.0.0.1:3000', replyAddress: 'replies+{site}@cuspline.test', inboundSecret: '' },
    outbox: { dispatcher: true, lane: '', pollMs: 2000, batchSize: 20, leaseSeconds: 120, maxAttempts: 8, retryBaseSeconds: 30, retryMaxSeconds: 3600 },
    sms: { accountSid: '', authToken: '', from: '', fakeUrl: '', webhookBaseUrl: '', defaultCountry: 'US' },
    scheduleClockOffsetMinutes: 0,
    public: {},
  }
}

describe('runtime config checks', () => {
  it('accepts the defaults, and values the tests and the demo seeder use', () => {
    expect(runtimeConfigProblems(config())).toEqual([])
    const tuned = config()
    tuned.auth.idleMinutes = 2 / 60
    tuned.auth.allowedOrigins = 'https://desk.example.test, http://127.0.0.1:8080'
    tuned.scheduleClockOffsetMinutes = -8 * 24 * 60
    tuned.db.lockWaitSeconds = 1
    expect(runtimeConfigProblems(tuned)).toEqual([])
  })

  it('accepts a number given as text, as the code reads it with Number()', () => {
    const tuned = config() as Record<string, any>
    tuned.db.port = '03307'
    expect(runtimeConfigProblems(tuned)).toEqual([])
  })

  it('names each wrong value by its NUXT_ variable', () => {
    const wrong = config() as Record<string, any>
    wrong.db.port = 'abc'
    wrong.auth.ipFailureLimit = 2.5
    wrong.outbox.dispatcher = 'no'
    wrong.mail.publicUrl = 'ftp://files.example.test'
    wrong.auth.allowedOrigins = 'desk.example.test'
    wrong.scheduleClockOffsetMinutes = 'yesterday'
    expect(runtimeConfigProblems(wrong)).toEqual([
      'NUXT_DB_PORT must be a whole number from 1 to 65535 (got "abc")',
      'NUXT_AUTH_IP_FAILURE_LIMIT must be a whole number, 1 or more (got 2.5)',
      'NUXT_AUTH_ALLOWED_ORIGINS must be comma-separated http:// or https:// origins (scheme://host[:port]) (got "desk.example.test")',
      'NUXT_MAIL_PUBLIC_URL must be an http:// or https:// address (got "ftp://files.example.test")',
      'NUXT_OUTBOX_DISPATCHER must be true or false (got "no")',
      'NUXT_SCHEDULE_CLOCK_OFFSET_MINUTES must be a number (got "yesterday")',
    ])
  })

  it('never prints a password or secret, only that it is wrong', () => {
    const wrong = config() as Record<string, any>
    wrong.db.password = ''
    wrong.mail.linkSecret = 'short-secret'
    expect(runtimeConfigProblems(wrong)).toEqual([
      'NUXT_DB_PASSWORD is required',
      'NUXT_MAIL_LINK_SECRET must be at least 32 characters',
    ])
  })

  it('text messages: off without an account; an account needs its token and sender', () => {
    const local = config()
    local.sms = { accountSid: `AC${'0a'.repeat(16)}`, authToken: 'f'.repeat(32), from: '+12095550100', fakeUrl: 'http://127.0.0.1:4010', webhookBaseUrl: '', defaultCountry: 'US' }
    expect(runtimeConfigProblems(local)).toEqual([])
    const half = config()
    half.sms = { ...half.sms, accountSid: `AC${'0a'.repeat(16)}` }
    expect(runtimeConfigProblems(half)).toEqual([
      'NUXT_SMS_AUTH_TOKEN is required when NUXT_SMS_ACCOUNT_SID is set',
      'NUXT_SMS_FROM is required when NUXT_SMS_ACCOUNT_SID is set (got "")',
    ])
    const wrong = config()
    wrong.sms = { ...wrong.sms, accountSid: 'AC123', from: '2095550100', fakeUrl: 'localhost:4010', defaultCountry: 'usa' }
    expect(runtimeConfigProblems(wrong)).toEqual([
      'NUXT_SMS_ACCOUNT_SID must be empty (no texts) or an account SID: AC and 32 hexadecimal characters (got "AC123")',
      'NUXT_SMS_FROM must be an E.164 number (+ and digits) or a messaging service SID (MG…) (got "2095550100")',
      'NUXT_SMS_FAKE_URL must be empty (the real service) or an http:// or https:// address (got "localhost:4010")',
      'NUXT_SMS_DEFAULT_COUNTRY must be a two-letter country code (ISO 3166-1 alpha-2), e.g. US (got "usa")',
    ])
  })

  it('turns a config path into the variable name Nuxt reads', () => {
    expect(envNameOf(['db', 'lockWaitSeconds'])).toBe('NUXT_DB_LOCK_WAIT_SECONDS')
    expect(envNameOf(['session', 'cookie', 'secure'])).toBe('NUXT_SESSION_COOKIE_SECURE')
    expect(envNameOf(['scheduleClockOffsetMinutes'])).toBe('NUXT_SCHEDULE_CLOCK_OFFSET_MINUTES')
  })
})

describe('every runtime setting is documented and checked', () => {
  /** Each leaf of nuxt.config's runtimeConfig (public keys aside) as its NUXT_ variable. */
  async function configuredNames(): Promise<string[]> {
    Object.assign(globalThis, { defineNuxtConfig: (options: unknown) => options })
    // By path, not by name, so the type checker does not take nuxt.config.ts into the tests' project.
    const { default: nuxtConfig } = await import(/* @vite-ignore */ resolve('nuxt.config.ts'))
    const names: string[] = []
    const walk = (value: unknown, path: string[]) => {
      if (value && typeof value === 'object' && !Array.isArray(value)) {
        for (const [key, inner] of Object.entries(value)) if (key !== 'public') walk(inner, [...path, key])
      } else {
        names.push(envNameOf(path))
      }
    }
    walk((nuxtConfig as { runtimeConfig: unknown }).runtimeConfig, [])
    return names.sort()
  }

  it('.env.example lists every key of runtimeConfig, and nothing else named NUXT_', async () => {
    const example = readFileSync(resolve('.env.example'), 'utf8')
    const listed = [...example.matchAll(/^(NUXT_[A-Z0-9_]+)=/gm)].map((match) => match[1]).sort()
    expect(listed).toEqual(await configuredNames())
  })

  it('the start-up check names a wrong value of every key', async () => {
    const wrong = config() as Record<string, any>
    const names = await configuredNames()
    for (const section of Object.values(wrong)) {
      if (section && typeof section === 'object') for (const key of Object.keys(section)) if (key !== 'cookie') section[key] = { not: 'a value' }
    }
    wrong.session.cookie = { sameSite: {}, httpOnly: {}, secure: {} }
    wrong.scheduleClockOffsetMinutes = {}
    const named = runtimeConfigProblems(wrong).map((line) => line.split(' ')[0]).sort()
    expect(named).toEqual(names)
  })
})
