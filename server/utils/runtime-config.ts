// What each runtime setting accepts (nuxt.config runtimeConfig, overridden by NUXT_* variables; every
// one is listed in .env.example). server/plugins/00.runtime-config.ts checks them once at start-up, so
// a wrong value stops the server with its variable's name instead of turning up later as a 500.
// Only checked, never converted: the code that reads a setting keeps reading it as before.
import { z } from 'zod'
import { isReplyTemplate } from '#shared/domain/reply-address'

// NUXT_* values arrive parsed: '5' is 5, 'true' is true; anything else stays a string. Numbers are read
// with Number() where they are used, so a string that is a number passes too.
function numberThat(words: string, ok: (value: number) => boolean) {
  return z.unknown().refine((value) => {
    const parsed = typeof value === 'number' ? value : typeof value === 'string' && value.trim() !== '' ? Number(value) : Number.NaN
    return Number.isFinite(parsed) && ok(parsed)
  }, `must be ${words}`)
}
const isText = (value: unknown) => typeof value === 'string' || typeof value === 'number'
const port = numberThat('a whole number from 1 to 65535', (n) => Number.isInteger(n) && n >= 1 && n <= 65535)
const aboveZero = numberThat('a number above 0', (n) => n > 0)
const zeroOrMore = numberThat('a number, 0 or more', (n) => n >= 0)
const wholeFrom = (min: number) => numberThat(`a whole number, ${min} or more`, (n) => Number.isInteger(n) && n >= min)
const anyNumber = numberThat('a number', () => true)
const flag = z.unknown().refine((value) => typeof value === 'boolean', 'must be true or false')
const text = z.unknown().refine(isText, 'must be text')
const required = z.unknown().refine((value) => isText(value) && String(value).trim() !== '', 'is required')
const secret = z.unknown().refine((value) => isText(value) && String(value).length >= 32, 'must be at least 32 characters')
const isOrigin = (entry: string) => URL.canParse(entry) && /^https?:$/.test(new URL(entry).protocol)
const httpAddress = z.unknown().refine((value) => typeof value === 'string' && isOrigin(value), 'must be an http:// or https:// address')
const origins = z.unknown().refine(
  (value) => value === '' || (typeof value === 'string' && value.split(',').map((entry) => entry.trim()).filter(Boolean).every(isOrigin)),
  'must be comma-separated http:// or https:// origins (scheme://host[:port])',
)

const RuntimeConfigSchema = z.object({
  db: z.object({
    host: required, port, user: required, password: required, database: required, lockWaitSeconds: zeroOrMore,
  }),
  auth: z.object({
    idleMinutes: aboveZero,
    absoluteHours: aboveZero,
    accountAddressFailureLimit: wholeFrom(1),
    ipFailureLimit: wholeFrom(1),
    failureWindowMinutes: aboveZero,
    delayFreeFailures: wholeFrom(0),
    delayBaseMs: zeroOrMore,
    delayMaxMs: zeroOrMore,
    trustProxy: flag,
    allowedOrigins: origins,
  }),
  session: z.object({
    password: secret,
    maxAge: aboveZero,
    cookie: z.object({ sameSite: z.enum(['lax', 'strict', 'none'], 'must be lax, strict or none'), httpOnly: flag, secure: flag }),
  }),
  smtp: z.object({ host: required, port, secure: flag, user: text, password: text, from: text }),
  mail: z.object({
    linkSecret: secret,
    publicUrl: httpAddress,
    replyAddress: z.unknown().refine((value) => value === '' || (typeof value === 'string' && isReplyTemplate(value)), "must be empty or one address with '{site}' in its local part, e.g. replies+{site}@example.org"),
    inboundSecret: z.unknown().refine((value) => value === '' || (isText(value) && String(value).length >= 32), 'must be empty or at least 32 characters'),
  }),
  outbox: z.object({
    dispatcher: flag,
    lane: text,
    pollMs: zeroOrMore,
    batchSize: wholeFrom(1),
    leaseSeconds: aboveZero,
    maxAttempts: wholeFrom(1),
    retryBaseSeconds: aboveZero,
    retryMaxSeconds: aboveZero,
  }),
  sms: z.object({
    accountSid: z.unknown().refine((value) => value === '' || (typeof value === 'string' && /^AC[0-9a-fA-F]{32}$/.test(value)), 'must be empty (no texts) or an account SID: AC and 32 hexadecimal characters'),
    authToken: text,
    from: z.unknown().refine((value) => value === '' || (typeof value === 'string' && (/^\+[1-9]\d{6,14}$/.test(value) || /^MG[0-9a-fA-F]{32}$/.test(value))), 'must be an E.164 number (+ and digits) or a messaging service SID (MG…)'),
    fakeUrl: z.unknown().refine((value) => value === '' || (typeof value === 'string' && isOrigin(value)), 'must be empty (the real service) or an http:// or https:// address'),
    webhookBaseUrl: z.unknown().refine((value) => value === '' || (typeof value === 'string' && isOrigin(value)), 'must be empty (NUXT_MAIL_PUBLIC_URL) or an http:// or https:// address'),
    defaultCountry: z.unknown().refine((value) => typeof value === 'string' && /^[A-Z]{2}$/.test(value), 'must be a two-letter country code (ISO 3166-1 alpha-2), e.g. US'),
  }).superRefine((sms, context) => {
    // An account needs its token (every request and webhook signature uses it) and a sender.
    if (typeof sms.accountSid !== 'string' || !/^AC[0-9a-fA-F]{32}$/.test(sms.accountSid)) return
    if (typeof sms.authToken === 'string' && sms.authToken.trim() === '') context.addIssue({ code: 'custom', path: ['authToken'], message: 'is required when NUXT_SMS_ACCOUNT_SID is set' })
    if (sms.from === '') context.addIssue({ code: 'custom', path: ['from'], message: 'is required when NUXT_SMS_ACCOUNT_SID is set' })
  }),
  scheduleClockOffsetMinutes: anyNumber,
})

/** `['db', 'lockWaitSeconds']` → `NUXT_DB_LOCK_WAIT_SECONDS`. */
export function envNameOf(path: ReadonlyArray<PropertyKey>): string {
  return ['NUXT', ...path.map((key) => String(key).replace(/([a-z0-9])([A-Z])/g, '$1_$2').toUpperCase())].join('_')
}

/** One line per wrong setting, naming its variable and, unless it is a secret, the value it had. */
export function runtimeConfigProblems(config: unknown): string[] {
  const result = RuntimeConfigSchema.safeParse(config)
  if (result.success) return []
  return result.error.issues.map((issue) => {
    const name = envNameOf(issue.path)
    let value: unknown = config
    for (const key of issue.path) value = (value as Record<PropertyKey, unknown> | undefined)?.[key]
    const shown = /PASSWORD|SECRET|TOKEN/.test(name) || value === undefined ? '' : ` (got ${JSON.stringify(value)})`
    return `${name} ${issue.message}${shown}`
  })
}
