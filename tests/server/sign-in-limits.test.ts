// Sign-in limits that strangers cannot turn against the account's owner (issue 11 §4, §3).
// OWASP ASVS 4.0.3 V2.2.1: anti-automation against credential guessing that does not lock out the owner;
// failures are counted per (account, client address) and per client address, an account only slows down.
// These tests run their own app process that trusts X-Forwarded-For (a test-only trusted-proxy setting),
// so each test can speak from its own addresses: RFC 5737 (IPv4) and RFC 3849 (IPv6) documentation ranges.
import { randomInt, randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient } from '../helpers/api-client'
import { startAppServer, type RunningServer } from '../helpers/app-server'
import { closeTestDb, createTestUser, testDb } from '../helpers/db'

const ADDRESS_LIMIT = 15 // this process only: NUXT_AUTH_IP_FAILURE_LIMIT (the default is 100)
const PAIR_LIMIT = 10 // the default NUXT_AUTH_ACCOUNT_ADDRESS_FAILURE_LIMIT
const WINDOW_SECONDS = 15 * 60

let server: RunningServer

beforeAll(async () => {
  server = await startAppServer({
    NUXT_AUTH_TRUST_PROXY: 'true',
    NUXT_AUTH_IP_FAILURE_LIMIT: String(ADDRESS_LIMIT),
    // Small delays keep the test quick; their growth is read from the audit log, never timed.
    NUXT_AUTH_DELAY_BASE_MS: '10',
    NUXT_AUTH_DELAY_MAX_MS: '40',
    NUXT_OUTBOX_DISPATCHER: 'false',
  })
})

afterAll(async () => {
  await server?.stop()
  await closeTestDb()
})

/** A random IPv6 /64 from the documentation prefix 2001:db8::/32 (RFC 3849), unique per test run. */
function documentationNetwork(): string {
  return `2001:db8:${randomInt(0x10000).toString(16)}:${randomInt(0x10000).toString(16)}`
}

function signInFrom(address: string, email: string, password: string) {
  return new ApiClient(server.url).post('/api/auth/login', { email, password }, { headers: { 'x-forwarded-for': address } })
}

async function auditOf(action: string, email: string) {
  const rows = await testDb()('audit_log').where({ action, entity_id: email }).orderBy('id')
  return rows.map((row) => ({ ...row, after: typeof row.after === 'string' ? JSON.parse(row.after) : row.after }))
}

describe('per (account, address)', () => {
  it('refuses an attacker address that used up its tries, while the owner at another address signs in', async () => {
    const owner = await createTestUser()
    const attacker = `198.51.100.${randomInt(1, 255)}` // TEST-NET-2, RFC 5737
    const ownerDesk = `203.0.113.${randomInt(1, 255)}` // TEST-NET-3, RFC 5737
    // Padding and capitals name the same account (the e-mail is trimmed and lower-cased).
    const spellings = [owner.email, owner.email.toUpperCase(), `  ${owner.email}  `]
    for (let attempt = 0; attempt < PAIR_LIMIT; attempt += 1) {
      const response = await signInFrom(attacker, spellings[attempt % spellings.length]!, `wrong-${attempt}-password`)
      expect(response.status).toBe(401)
    }

    // The attacker's address is refused now, even with the right password, and told when to come back.
    const refused = await signInFrom(attacker, owner.email, owner.password)
    expect(refused.status).toBe(429)
    const retryAfter = Number(refused.headers.get('retry-after'))
    expect(retryAfter).toBeGreaterThan(0)
    expect(retryAfter).toBeLessThanOrEqual(WINDOW_SECONDS)
    expect(refused.body.message).toBe('Too many failed sign-in attempts. Try again later.')
    // Entries a client writes before our proxy's own do not get it out (only the last one counts).
    expect((await signInFrom(`192.0.2.${randomInt(1, 255)}, ${attacker}`, owner.email, owner.password)).status).toBe(429)

    // The owner, at the front desk's own address, still signs in: no lockout, only a capped delay.
    const ownerSignIn = await signInFrom(ownerDesk, owner.email, owner.password)
    expect(ownerSignIn.status).toBe(200)
    expect(ownerSignIn.body.user.email).toBe(owner.email)

    // Every refusal and failure is audited, with the address it came from.
    const refusals = await auditOf('sign_in_refused', owner.email)
    expect(refusals).toHaveLength(2)
    expect(refusals[0]).toMatchObject({ user_id: owner.id, ip: attacker, after: { reason: 'account_and_address', failures: PAIR_LIMIT } })
    const failures = await auditOf('sign_in_failed', owner.email)
    expect(failures).toHaveLength(PAIR_LIMIT)
    expect(failures.every((row) => row.ip === attacker)).toBe(true)
    // The delay grows with the account's failures (3 free, then 10 ms doubling, capped at 40 ms here).
    expect(failures.map((row) => row.after.delayMs)).toEqual([0, 0, 0, 10, 20, 40, 40, 40, 40, 40])
    const [signedIn] = await auditOf('sign_in', String(owner.id))
    expect(signedIn).toMatchObject({ ip: ownerDesk, after: { delayMs: 40 } })
  })

  it('starts a desk\'s count again after it signs in, so its own typing mistakes never add up to a refusal', async () => {
    const owner = await createTestUser()
    const desk = `${documentationNetwork()}::d35c`
    // 2 × 6 = 12 mistakes on this account from this address: more than its 10, fewer than the address's 15.
    for (let round = 0; round < 2; round += 1) {
      for (let attempt = 0; attempt < 6; attempt += 1) {
        expect((await signInFrom(desk, owner.email, 'a-typing-mistake')).status).toBe(401)
      }
      expect((await signInFrom(desk, owner.email, owner.password)).status).toBe(200)
    }
  })

  it('holds when the attacker sends its tries all at once (each attempt is counted before its password is checked)', async () => {
    const owner = await createTestUser()
    const attacker = `${documentationNetwork()}::bad`
    const extra = 4
    const answers = await Promise.all(Array.from({ length: PAIR_LIMIT + extra }, (_, attempt) => signInFrom(attacker, owner.email, `wrong-${attempt}-password`)))
    const statuses = answers.map((answer) => answer.status).sort()
    expect(statuses.filter((status) => status === 401).length).toBeLessThanOrEqual(PAIR_LIMIT)
    expect(statuses.filter((status) => status === 429).length).toBeGreaterThanOrEqual(extra)
    expect(statuses.every((status) => status === 401 || status === 429)).toBe(true)
    // Refused tries are not counted as failures: the account saw at most the limit.
    expect((await testDb()('sign_in_attempts').where({ email: owner.email, succeeded: false })).length).toBeLessThanOrEqual(PAIR_LIMIT)
    expect((await signInFrom(`${documentationNetwork()}::1`, owner.email, owner.password)).status).toBe(200)
  })
})

describe('per address', () => {
  it('refuses an address that failed too often across accounts with 429 and Retry-After, and its whole IPv6 /64', async () => {
    const owner = await createTestUser()
    const network = documentationNetwork()
    for (let attempt = 0; attempt < ADDRESS_LIMIT; attempt += 1) {
      // A different made-up account each time, so only the per-address count can stop it.
      const response = await signInFrom(`${network}::1`, `guess-${randomUUID()}@fernhollow.test`, 'password-guess')
      expect(response.status).toBe(401)
    }
    const refused = await signInFrom(`${network}::1`, owner.email, owner.password)
    expect(refused.status).toBe(429)
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(refused.body.message).toBe('Too many failed sign-in attempts. Try again later.')
    // Another address in the same /64 is the same line (RFC 6177 §2: a /64 per subscriber link).
    expect((await signInFrom(`${network}::beef`, owner.email, owner.password)).status).toBe(429)

    const [refusal] = await auditOf('sign_in_refused', owner.email)
    expect(refusal).toMatchObject({ ip: `${network}::1`, after: { reason: 'address', failures: ADDRESS_LIMIT } })

    // The owner elsewhere is not affected.
    expect((await signInFrom(`${documentationNetwork()}::1`, owner.email, owner.password)).status).toBe(200)
  })
})

describe('long e-mail addresses (§3)', () => {
  // The main test server (no trusted proxy): the address is 127.0.0.1.
  it('answers a wrong sign-in with a 70-character e-mail with 401 and audits it in full', async () => {
    const email = `${'a'.repeat(70 - '@fernhollow.test'.length - 8)}${randomUUID().slice(0, 8)}@fernhollow.test`
    expect(email).toHaveLength(70)
    const response = await new ApiClient().post('/api/auth/login', { email, password: 'not-the-password' })
    expect(response.status).toBe(401)
    expect(await auditOf('sign_in_failed', email)).toHaveLength(1)
    expect(await testDb()('sign_in_attempts').where({ email, succeeded: false })).toHaveLength(1)
  })

  it('takes e-mails up to 254 characters (RFC 5321 §4.5.3.1.3) and names the field beyond that', async () => {
    const domain = `${'d'.repeat(63)}.${'e'.repeat(63)}.${'f'.repeat(56)}.test` // labels ≤ 63 (RFC 1035 §2.3.4)
    const local = `${randomUUID().replaceAll('-', '')}${'l'.repeat(32)}` // local part ≤ 64 (RFC 5321 §4.5.3.1.1)
    const longest = `${local}@${domain}`
    expect(longest).toHaveLength(254)
    const answered = await new ApiClient().post('/api/auth/login', { email: longest, password: 'not-the-password' })
    expect(answered.status).toBe(401)
    expect(await auditOf('sign_in_failed', longest)).toHaveLength(1)

    const tooLong = await new ApiClient().post('/api/auth/login', { email: `x${longest}`, password: 'not-the-password' })
    expect(tooLong.status).toBe(400)
    expect(tooLong.body.data.field).toBe('email')
  })
})
