// No 5xx for anything a caller can send (issue 11 §3). Every route file under server/api/ is found
// by walking the folder, and each route and method gets generated bodies, query strings and path
// ids (wrong types, nulls, huge and negative numbers, 2^31 and 2^53+1, invalid and extreme dates,
// long and control-character strings, bad percent-encoding, __proto__ keys, deep nesting), sent
// signed out, as a front desk and as an admin. Any 5xx (or a dropped connection) fails the test
// with the exact requests, and the seed: replay with FUZZ_SEED=<seed>.
//
// Safe beside the other test files (one app, one database): the fuzz signs in as its own two
// accounts; path ids never name an existing row (so PATCH/DELETE/resend find nothing); a body that
// a write route's own schema would accept is never sent to a route without a path id; sign-out is
// sent signed out only; sign-in only gets bodies its schema refuses, so no attempt is counted.
import { readdirSync, statSync } from 'node:fs'
import { join, relative } from 'node:path'
import { Agent, request as httpRequest } from 'node:http'
import fc from 'fast-check'
import type { ZodType } from 'zod'
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest'
import { ApiClient } from '../helpers/api-client'
import { closeTestDb, createTestUser, testDb } from '../helpers/db'
import { daysFromToday } from '../helpers/dates'
import { SignInSchema } from '../../shared/schemas/auth'
import { BookVisitSchema, NewPatientSchema } from '../../shared/schemas/visits'
import { PatientMergeSchema } from '../../shared/schemas/patients'
import { ImportUploadSchema } from '../../shared/schemas/patient-imports'
import { OperatorySchema, SiteSchema } from '../../shared/schemas/sites'
import { ProviderSchema, StaffSchema } from '../../shared/schemas/people'
import { BlockSchema, ShiftExceptionSchema, ShiftSchema } from '../../shared/schemas/rota'
import { TemplateSchema } from '../../shared/schemas/templates'
import { NewWaitlistEntrySchema, SendOffersSchema } from '../../shared/schemas/waitlist'
import { RecallMailSchema } from '../../shared/schemas/recall'
import { RotaMoveSchema } from '../../shared/schemas/balance'

const SEED = process.env.FUZZ_SEED ? Number(process.env.FUZZ_SEED) : Math.floor(Math.random() * 2 ** 31)
const MIN_REQUESTS = 10_000
const CONCURRENCY = 6
const API_DIR = join(process.cwd(), 'server/api')

// ─── Routes, found on disk ────────────────────────────────────────────────────────────────────

interface Route { method: string; template: string; params: string[] }

const METHODS = ['get', 'post', 'put', 'patch', 'delete'] as const

function discoverRoutes(dir = API_DIR): Route[] {
  const routes: Route[] = []
  for (const name of readdirSync(dir).sort()) {
    const full = join(dir, name)
    if (statSync(full).isDirectory()) { routes.push(...discoverRoutes(full)); continue }
    if (!name.endsWith('.ts')) continue
    const parts = name.slice(0, -3).split('.')
    const method = (METHODS as readonly string[]).includes(parts.at(-1)!) ? parts.pop()! : null
    const base = parts.join('.')
    const segments = relative(API_DIR, dir).split('/').filter(Boolean)
    if (base !== 'index') segments.push(base)
    const template = `/api/${segments.join('/')}`.replace(/\/$/, '')
    const params = [...template.matchAll(/\[(\w+)\]/g)].map((match) => match[1]!)
    for (const verb of method ? [method] : ['get', 'post']) routes.push({ method: verb.toUpperCase(), template, params })
  }
  return routes
}

/**
 * Write routes without a path id would create real rows when a body happens to be valid: those
 * bodies are never sent (their schema decides). A new write route must be added here.
 */
const CREATE_GUARDS: Record<string, ZodType> = {
  'POST /api/visits': BookVisitSchema,
  'POST /api/blocks': BlockSchema,
  'POST /api/operatories': OperatorySchema,
  'POST /api/patients': NewPatientSchema,
  'POST /api/patient-imports': ImportUploadSchema,
  'POST /api/patient-merges': PatientMergeSchema,
  'POST /api/providers': ProviderSchema,
  'POST /api/shift-exceptions': ShiftExceptionSchema,
  'POST /api/shifts': ShiftSchema,
  'POST /api/sites': SiteSchema,
  'POST /api/templates': TemplateSchema,
  'POST /api/users': StaffSchema,
  'POST /api/auth/login': SignInSchema,
  'POST /api/waitlist': NewWaitlistEntrySchema,
  'POST /api/waitlist/offers': SendOffersSchema,
  'POST /api/recalls/mail': RecallMailSchema,
  'POST /api/balance/rota-moves': RotaMoveSchema,
}
/** Writes that change nothing stored: any body may go. The inbound-mail webhook refuses every post
 * without the shared secret's signature (401), and the SMS service's webhooks change nothing without
 * its signature (X-Twilio-Signature, made with the account's token); the fuzz can make neither. */
const READ_ONLY_POSTS = new Set(['POST /api/openings', 'POST /api/chair-time', 'POST /api/inbound/mail', 'POST /api/sms/status', 'POST /api/sms/inbound'])

// ─── Values ───────────────────────────────────────────────────────────────────────────────────

const BIG = '\u0001BIG2^53+1\u0001' // replaced by the literal 9007199254740993 in the JSON text
const extremeNumber = fc.constantFrom(0, -0, -1, 1.5, -2_147_483_648, 2_147_483_647, 2 ** 31, 2 ** 32, Number.MAX_SAFE_INTEGER, 1e21, 1e308, -1e308, 5e-324, 1, 2, 3)
const dateText = fc.constantFrom(
  '9999-12-31', '9999-12-25', '0000-01-01', '1969-12-31', '1999-12-31', '2026-02-30', '2026-13-01', '+275760-09-13',
  '9999-12-31T23:50:00Z', '-000001-01-01T00:00:00Z', '2027-01-11T25:00:00Z', '2027-01-11T10:00:00+14:00', '2027-01-11T10:00:00.123456789Z',
  '1970-01-01T00:00:00Z', 'today', '', daysFromToday(1), daysFromToday(7), `${daysFromToday(14)}T16:00:00Z`, daysFromToday(-3), daysFromToday(3 * 366),
)
const badPercent = fc.constantFrom('%ZZ', '%', '%E0%A4%A', '%C0%AE', '%00', '%FF%FE', '%u0041', '%%', '%2', '%252F')
const controlText = fc.constantFrom('\u0000', '\r\nBcc: x@example.test', '\t', '\u0085', '\u2028', '\u001b[31m', 'a\u0000b', '\uD800', '\uFFFF')
const plainWords = fc.constantFrom('', ' ', 'a', 'Ann', 'COMP-POST', 'EXAM', '19', 'MO', 'MODBL', 'admin', 'true', 'false', 'null', '__proto__', 'constructor',
  'FREQ=DAILY', 'FREQ=SECONDLY', 'FREQ=DAILY;COUNT=99999999', 'FREQ=WEEKLY;BYDAY=MO;UNTIL=99991231T000000Z', 'America/Denver', 'Not/AZone', '08:00', '24:00', '25:61', '#0f766e',
  'desk.quarry@fernhollow.test', `${'a'.repeat(64)}@${'b'.repeat(200)}.test`, 'booked', 'cancelled', 'treating', 'morning', 'iso', 'universal')
const longText = fc.constantFrom('x'.repeat(5_000), 'é'.repeat(70_000), '%'.repeat(3_000), '9'.repeat(400))
const anyString = fc.oneof(
  { weight: 3, arbitrary: plainWords },
  { weight: 3, arbitrary: dateText },
  { weight: 2, arbitrary: fc.string({ maxLength: 30, unit: 'binary' }) },
  { weight: 1, arbitrary: controlText },
  { weight: 1, arbitrary: badPercent },
  { weight: 1, arbitrary: longText },
  { weight: 1, arbitrary: extremeNumber.map(String) },
)
const leaf = fc.oneof(
  { weight: 4, arbitrary: anyString },
  { weight: 3, arbitrary: extremeNumber },
  { weight: 1, arbitrary: fc.constant(BIG) },
  { weight: 1, arbitrary: fc.constantFrom(null, true, false) },
  { weight: 1, arbitrary: fc.double() },
)

const FIELD_NAMES = [
  'siteId', 'siteIds', 'providerId', 'patientId', 'operatoryId', 'userId', 'templateId', 'visitId', 'preferredSiteId',
  'from', 'to', 'fromUtc', 'toUtc', 'startUtc', 'validFrom', 'validUntil', 'startDate', 'endDate', 'untilDate', 'dateOfBirth', 'closedDates',
  'localStart', 'localEnd', 'rrule', 'timeZone', 'openingHours', 'quietHours', 'items', 'steps', 'anaesthesia', 'lengthOverride',
  'note', 'reason', 'name', 'firstName', 'lastName', 'email', 'phone', 'password', 'q', 'code', 'slug', 'address', 'whatToBring',
  'rowVersion', 'state', 'role', 'kind', 'category', 'capability', 'capabilities', 'colour', 'limit', 'sortOrder', 'chairMinutes',
  'bookingUnitMinutes', 'minimumNoticeMinutes', 'reminderOffsetsHours', 'alarmMinutes', 'quietBelow', 'tightFrom',
  'active', 'allSites', 'emailConsent', 'fewestGaps', 'includeProcedureNames', 'partOfDay', 'patientCancel', 'toothNotation',
  'templateCode', 'survivorId', 'mergedId', 'take', 'mapping', 'dateOrder', 'choices', 'csv', 'fileName', 'alertText', 'smsConsent', 'exceptId', 'page', 'tooth', 'teeth', 'surfaces', 'notation', 'token', '__proto__', 'constructor', 'prototype', 'toString', 'hasOwnProperty',
] as const
const fieldName = fc.oneof({ weight: 9, arbitrary: fc.constantFrom(...FIELD_NAMES) }, { weight: 1, arbitrary: fc.string({ maxLength: 12 }) })

/** A JSON value: leaves, lists and objects with the API's own field names, a few levels deep. */
const { value: jsonValue } = fc.letrec((tie) => ({
  value: fc.oneof({ depthSize: 'small', withCrossShrink: true }, leaf, tie('list'), tie('object')),
  list: fc.array(tie('value'), { maxLength: 4 }),
  object: fc.dictionary(fieldName, tie('value'), { maxKeys: 6 }),
}))

/** Something shaped like a visit's procedure, with one field made strange. */
const planItem = fc.record({
  templateCode: fc.oneof(fc.constantFrom('COMP-POST', 'EXAM', 'PROPHY', 'EXT-SIMPLE'), anyString),
  tooth: fc.oneof(fc.constantFrom('19', '3', '46', 'A'), leaf),
  surfaces: fc.oneof(fc.constantFrom('MO', 'MOD', 'O'), anyString),
  anaesthesia: fc.oneof(fc.constantFrom('none', 'infiltration', 'block'), leaf),
}, { requiredKeys: ['templateCode'] })

/** Bodies a route would accept, give or take one field: so the strange value reaches past the first check. */
const ITEMS = [{ templateCode: 'COMP-POST', tooth: '19', surfaces: 'MO', anaesthesia: 'infiltration' }]
const WEEK = { 1: [{ start: '08:00', end: '17:00' }], 2: [], 3: [], 4: [], 5: [], 6: [], 7: [] }
const NEAR_VALID: Array<Record<string, unknown>> = [
  { patientId: 1, siteId: 1, operatoryId: 1, providerId: 1, startUtc: `${daysFromToday(21)}T16:00:00Z`, items: ITEMS, note: '' },
  { rowVersion: 1, startUtc: `${daysFromToday(21)}T17:00:00Z`, operatoryId: 2, lengthOverride: { chairMinutes: 60, reason: 'longer' } },
  { firstName: 'Ann', lastName: 'Lee', dateOfBirth: '1990-01-01', email: 'ann@example.test', phone: '555-0100', preferredSiteId: 1, emailConsent: true },
  { providerId: 1, siteId: 1, rrule: 'FREQ=WEEKLY;BYDAY=MO', validFrom: daysFromToday(7), validUntil: daysFromToday(60), localStart: '08:00', localEnd: '12:00' },
  { providerId: 1, kind: 'extra', siteId: 1, startDate: daysFromToday(9), endDate: daysFromToday(9), localStart: '08:00', localEnd: '12:00', reason: 'cover' },
  { siteId: 1, operatoryId: 1, startDate: daysFromToday(5), localStart: '08:00', localEnd: '09:00', rrule: 'FREQ=WEEKLY', untilDate: daysFromToday(50), reason: 'Meeting' },
  { minimumNoticeMinutes: 60, reminderOffsetsHours: [48, 3], quietHours: { start: '20:00', end: '08:00' }, includeProcedureNames: false, patientCancel: 'request', whatToBring: 'Card', alarmMinutes: 30 },
  { items: ITEMS, siteIds: [1, 2, 3], from: daysFromToday(1), to: daysFromToday(30), partOfDay: 'any', limit: 500, fewestGaps: true },
  { siteId: 1, items: ITEMS },
  { name: 'Annex', timeZone: 'America/Denver', openingHours: WEEK, closedDates: [daysFromToday(40)], bookingUnitMinutes: 5 },
  { email: 'new.person@fernhollow.test', name: 'New Person', role: 'front_desk', siteIds: [1], password: 'a-long-test-password' },
  { siteId: 1, name: 'Room 9', capabilities: ['restorative'], sortOrder: 9 },
  { userId: 1, colour: '#2563eb', capabilities: ['restorative'] },
  { reason: 'Patient asked', rowVersion: 1 }, { state: 'confirmed', rowVersion: 1 }, { password: 'another-long-password' },
]
const nearValidBody = fc.tuple(fc.constantFrom(...NEAR_VALID), fieldName, fc.oneof(leaf, leaf, jsonValue))
  .map(([base, key, value]) => toJson({ ...base, [key]: value }))

/** Request bodies as JSON text (or deliberately not JSON). */
const bodyText = fc.oneof(
  { weight: 6, arbitrary: nearValidBody },
  { weight: 8, arbitrary: fc.dictionary(fieldName, fc.oneof(leaf, jsonValue, fc.array(planItem, { maxLength: 3 })), { maxKeys: 8 }).map(toJson) },
  { weight: 2, arbitrary: jsonValue.map(toJson) },
  { weight: 2, arbitrary: fc.constantFrom(
    '', '{', '[1,', 'null', '"text"', '123', 'true', '{"a":1}{"b":2}', '\u0000', '{"siteId":9007199254740993}', '{"from":"9999-12-31","to":"9999-12-31"}',
    '{"__proto__":{"role":"admin","allSites":true},"siteId":1}', '{"constructor":{"prototype":{"polluted":true}}}',
    '['.repeat(20_000) + ']'.repeat(20_000), '{"a":'.repeat(10_000) + '1' + '}'.repeat(10_000), `{"items":[${'{"templateCode":"EXAM"},'.repeat(2_000)}{}]}`,
    '{"startUtc":"9999-12-31T23:50:00Z","rowVersion":1}', '{"preferredSiteId":2147483647,"firstName":"A","lastName":"B","dateOfBirth":"1990-01-01"}',
  ) },
)

/** Percent-encodes the UTF-8 bytes of any string (a lone surrogate becomes U+FFFD, as a browser sends it). */
function percentEncode(text: string): string {
  return [...Buffer.from(text, 'utf8')].map((byte) => (/[A-Za-z0-9\-_.~]/.test(String.fromCharCode(byte)) ? String.fromCharCode(byte) : `%${byte.toString(16).toUpperCase().padStart(2, '0')}`)).join('')
}

function toJson(value: unknown): string {
  return JSON.stringify(value).replaceAll(JSON.stringify(BIG), '9007199254740993')
}

const QUERY_KEYS = ['siteId', 'providerId', 'patientId', 'visitId', 'from', 'to', 'fromUtc', 'toUtc', 'q', 'limit', 'state', 'token',
  'includeInactive', 'includeCancelled', 'quietBelow', 'tightFrom', '__proto__', 'constructor', 'siteId[]', 'from[x]'] as const
const queryValue = fc.oneof(
  { weight: 6, arbitrary: anyString.map(percentEncode) },
  { weight: 2, arbitrary: badPercent },
  { weight: 1, arbitrary: fc.constantFrom('1', '2', '1e3', '0x10', '%201', '+1', '-1', '2147483648', '9007199254740993', 'Infinity', 'NaN') },
)
// Each value is cut at 1,500 characters (perhaps mid-escape, which is one more bad encoding), so the
// request line stays under Node's 16 KiB header limit and the app, not the HTTP parser, answers.
const queryString = fc.array(fc.tuple(fc.constantFrom(...QUERY_KEYS), queryValue), { maxLength: 6 })
  .map((pairs) => (pairs.length ? `?${pairs.map(([key, value]) => `${key}=${value.slice(0, 1_500)}`).join('&')}` : ''))

/** A path segment for [id] or [token]: never one that names an existing row. */
const pathSegment = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom('0', '-1', '1.5', '1e3', '0x10', '2147483647', '2147483648', '4294967296', '9007199254740993', '9'.repeat(400),
    'abc', 'null', 'undefined', '__proto__', 'constructor', '%20', '%00', '%2F', '..', '%2E%2E', '%20%20', '1.2.3', `1.${Math.floor(Date.now() / 1000) + 86_400}.${'A'.repeat(43)}`,
    `99999999999.1.${'A'.repeat(43)}`, `${'A'.repeat(43)}%`) },
  { weight: 2, arbitrary: badPercent },
  { weight: 2, arbitrary: fc.string({ minLength: 1, maxLength: 40, unit: 'binary' }).map(percentEncode) },
  { weight: 1, arbitrary: fc.string({ minLength: 1, maxLength: 10 }).map((text) => `1.1.${percentEncode(text)}%`) },
).map((segment) => segment.slice(0, 1_500)).map((segment) => (namesRealRow(segment) ? `x${segment}` : segment))

/** Would the server read this segment as an id that may exist? (Then the fuzz could change real rows.) */
function namesRealRow(segment: string): boolean {
  let decoded = segment
  try { decoded = decodeURIComponent(segment) } catch { /* stays raw */ }
  const value = Number(decoded)
  return decoded.trim() !== '' && Number.isInteger(value) && value > 0 && value < 2_000_000_000
}

// ─── Sending ──────────────────────────────────────────────────────────────────────────────────

interface Case { role: Role; method: string; path: string; body: string | undefined }
interface Outcome { status: number; text: string }
type Role = 'signed out' | 'front desk' | 'admin'

const agent = new Agent({ keepAlive: true, maxSockets: CONCURRENCY })

function send(base: URL, cookie: string, item: Case): Promise<Outcome> {
  return new Promise((resolve) => {
    const headers: Record<string, string | number> = { accept: 'application/json' }
    if (cookie) headers.cookie = cookie
    const payload = item.body === undefined ? undefined : Buffer.from(item.body, 'utf8')
    if (payload) { headers['content-type'] = 'application/json'; headers['content-length'] = payload.length }
    const req = httpRequest({ agent, host: base.hostname, port: base.port, method: item.method, path: item.path, headers }, (res) => {
      const chunks: Buffer[] = []
      res.on('data', (chunk: Buffer) => chunks.push(chunk))
      res.on('end', () => resolve({ status: res.statusCode ?? 0, text: Buffer.concat(chunks).toString('utf8').slice(0, 400) }))
      res.on('error', (error) => resolve({ status: -1, text: String(error) }))
    })
    req.on('error', (error) => resolve({ status: -1, text: String(error) }))
    req.end(payload)
  })
}

async function runPool<T>(items: T[], worker: (item: T) => Promise<void>): Promise<void> {
  let next = 0
  await Promise.all(Array.from({ length: CONCURRENCY }, async () => {
    while (next < items.length) {
      const item = items[next++]!
      await worker(item)
    }
  }))
}

// ─── The test ─────────────────────────────────────────────────────────────────────────────────

const cookies: Record<Role, string> = { 'signed out': '', 'front desk': '', admin: '' }

beforeAll(async () => {
  console.info(`no-server-errors: seed ${SEED} (replay with FUZZ_SEED=${SEED})`)
  const desk = await createTestUser({ role: 'front_desk', siteSlugs: ['quarry-street'] })
  const admin = await createTestUser({ role: 'admin', siteSlugs: [] })
  await testDb()('users').where({ id: admin.id }).update({ all_sites: true })
  for (const [role, account] of [['front desk', desk], ['admin', admin]] as const) {
    const client = new ApiClient()
    await client.signIn(account.email, account.password)
    cookies[role] = client.cookie
  }
})
afterAll(async () => {
  agent.destroy()
  await closeTestDb()
})

describe('no request a caller can send is answered with a 5xx', () => {
  const routes = discoverRoutes()

  it('finds every route file under server/api/', () => {
    expect(routes.length).toBeGreaterThan(50)
    expect(routes).toContainEqual({ method: 'PATCH', template: '/api/visits/[id]', params: ['id'] })
    expect(routes).toContainEqual({ method: 'POST', template: '/api/visit/[token]/confirm', params: ['token'] })
    expect(routes).toContainEqual({ method: 'GET', template: '/api/rota', params: [] })
    for (const route of routes) {
      const key = `${route.method} ${route.template}`
      if (route.method !== 'GET' && route.params.length === 0 && key !== 'POST /api/auth/logout') {
        expect(CREATE_GUARDS[key] ?? READ_ONLY_POSTS.has(key), `${key}: add a guard so the fuzz never creates real rows`).toBeTruthy()
      }
    }
  })

  it(`answers ${MIN_REQUESTS}+ generated requests over every route, role and method without a 5xx (seed ${SEED})`, async () => {
    const casesPerRoute = Math.ceil(MIN_REQUESTS / 3 / routes.length) + 2
    const cases: Case[] = []
    routes.forEach((route, index) => {
      const key = `${route.method} ${route.template}`
      const hasBody = route.method !== 'GET'
      const generated = fc.sample(fc.record({
        segments: fc.array(pathSegment, { minLength: route.params.length, maxLength: route.params.length }),
        query: queryString,
        body: hasBody ? fc.option(bodyText, { freq: 8 }) : fc.constant(null),
      }), { seed: SEED + index, numRuns: casesPerRoute })
      for (const sample of generated) {
        let path = route.template
        route.params.forEach((param, at) => { path = path.replace(`[${param}]`, sample.segments[at]!) })
        let body = sample.body ?? undefined
        const guard = CREATE_GUARDS[key]
        if (guard && body !== undefined && parsesAs(guard, body)) body = '{}'
        for (const role of ['signed out', 'front desk', 'admin'] as const) {
          if (key === 'POST /api/auth/logout' && role !== 'signed out') continue
          cases.push({ role, method: route.method, path: `${path}${sample.query}`, body })
        }
      }
    })

    const base = new URL(inject('baseURL'))
    const failures: string[] = []
    const statuses = new Map<number, number>()
    await runPool(cases, async (item) => {
      let outcome = await send(base, cookies[item.role], item)
      if (outcome.status === -1) outcome = await send(base, cookies[item.role], item) // a reused socket the server had closed
      statuses.set(outcome.status, (statuses.get(outcome.status) ?? 0) + 1)
      if (outcome.status >= 500 || outcome.status === -1) {
        failures.push(`${item.role} ${item.method} ${item.path.slice(0, 200)} body=${JSON.stringify(item.body?.slice(0, 200))} → ${outcome.status} ${outcome.text}`)
      }
    })

    console.info(`no-server-errors: ${cases.length} requests over ${routes.length} routes (seed ${SEED}); statuses ${JSON.stringify(Object.fromEntries([...statuses].sort(([a], [b]) => a - b)))}`)
    expect(cases.length).toBeGreaterThanOrEqual(MIN_REQUESTS)
    expect(failures.slice(0, 20), `${failures.length} requests answered 5xx; replay with FUZZ_SEED=${SEED}`).toEqual([])
    // The fuzz accounts are still signed in: nothing it sent ended their sessions.
    const me = await send(base, cookies.admin, { role: 'admin', method: 'GET', path: '/api/me', body: undefined })
    expect(me.status).toBe(200)
  }, 600_000)
})

function parsesAs(schema: ZodType, text: string): boolean {
  try {
    return schema.safeParse(JSON.parse(text)).success
  } catch {
    return false
  }
}
