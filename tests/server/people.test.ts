// Staff accounts and providers over HTTP: passwords, roles, scopes, revocation.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedInAs } from '../helpers/api-client'
import { closeTestDb, createTestUser, siteIdBySlug, testDb } from '../helpers/db'

let admin: ApiClient
let manager: ApiClient
let aspen: number

beforeAll(async () => {
  admin = await signedInAs('admin@fernhollow.test')
  manager = await signedInAs('manager@fernhollow.test')
  aspen = await siteIdBySlug('aspen-gulch')
})
afterAll(closeTestDb)

// test-… e-mails: the seed check in migrations.test.ts skips throwaway accounts.
const newEmail = () => `test-staff-${randomUUID().slice(0, 8)}@fernhollow.test`

describe('staff accounts', () => {
  it('refuses a password shorter than 12 characters', async () => {
    const response = await admin.post('/api/users', { email: newEmail(), name: 'Ada Short', role: 'front_desk', siteIds: [aspen], password: 'short-pass' })
    expect(response.status).toBe(400)
    expect(response.body.data).toMatchObject({ field: 'password', reason: 'must be at least 12 characters' })
  })

  it('needs a site unless the account is group-wide', async () => {
    const response = await admin.post('/api/users', { email: newEmail(), name: 'Nobody Anywhere', role: 'front_desk', siteIds: [], password: 'a-long-enough-password' })
    expect(response.body.data.field).toBe('siteIds')
  })

  it('creates a hygienist who can sign in and is a provider at the site', async () => {
    const email = newEmail()
    const created = await admin.post('/api/users', { email, name: 'Hana Brookfield', role: 'hygienist', siteIds: [aspen], password: 'a-long-enough-password' })
    expect(created.status).toBe(201)
    expect(created.body).toMatchObject({ email, role: 'hygienist', siteIds: [aspen], active: true })
    expect(created.body.providerId).toBeGreaterThan(0)
    expect(JSON.stringify(created.body)).not.toMatch(/hash|password/i)
    const stored = await testDb()('users').where({ email }).first('password_hash')
    expect(stored.password_hash).toMatch(/^\$scrypt\$/)

    const providers = await manager.get(`/api/providers?siteId=${aspen}`)
    expect(providers.body).toContainEqual(expect.objectContaining({ id: created.body.providerId, name: 'Hana Brookfield', kind: 'hygienist', colour: '#2563eb' }))
    await new ApiClient().signIn(email, 'a-long-enough-password')

    const duplicate = await admin.post('/api/users', { email, name: 'Hana Again', role: 'hygienist', siteIds: [aspen], password: 'a-long-enough-password' })
    expect(duplicate.status).toBe(409)
  })

  it('lets managers read accounts but not create them; front desk reads none', async () => {
    expect((await manager.get('/api/users')).status).toBe(200)
    expect((await manager.post('/api/users', { email: newEmail(), name: 'X', role: 'admin', allSites: true, password: 'a-long-enough-password' })).status).toBe(403)
    const desk = await signedInAs('desk.aspen@fernhollow.test')
    expect((await desk.get('/api/users')).status).toBe(403)
  })

  it('ends every session of a deactivated account and bumps session_version', async () => {
    const person = await createTestUser({ siteSlugs: ['aspen-gulch'] })
    const client = new ApiClient()
    await client.signIn(person.email, person.password)
    const before = await testDb()('users').where({ id: person.id }).first('session_version')
    const response = await admin.patch(`/api/users/${person.id}`, { active: false })
    expect(response.body.active).toBe(false)
    const after = await testDb()('users').where({ id: person.id }).first('session_version')
    expect(after.session_version).toBe(before.session_version + 1)
    expect((await client.get('/api/me')).status).toBe(401)
    expect((await new ApiClient().post('/api/auth/login', { email: person.email, password: person.password })).status).toBe(401)
  })

  it('resets a password: old sessions end and the new password works', async () => {
    const person = await createTestUser({ siteSlugs: ['aspen-gulch'] })
    const client = new ApiClient()
    await client.signIn(person.email, person.password)
    const short = await admin.post(`/api/users/${person.id}/password`, { password: 'too-short' })
    expect(short.body.data.field).toBe('password')
    expect((await admin.post(`/api/users/${person.id}/password`, { password: 'a-brand-new-password' })).status).toBe(200)
    expect((await client.get('/api/me')).status).toBe(401)
    await new ApiClient().signIn(person.email, 'a-brand-new-password')
  })

  it('changes role and site scope; an admin cannot deactivate themself', async () => {
    const person = await createTestUser({ siteSlugs: ['aspen-gulch'] })
    const quarry = await siteIdBySlug('quarry-street')
    const changed = await admin.patch(`/api/users/${person.id}`, { role: 'assistant', siteIds: [quarry, aspen] })
    expect(changed.body).toMatchObject({ role: 'assistant', siteIds: [quarry, aspen].sort((a, b) => a - b) })
    const me = (await admin.get('/api/me')).body.user
    const self = await admin.patch(`/api/users/${me.id}`, { active: false })
    expect(self.status).toBe(400)
    expect(self.body.data.field).toBe('active')
  })
})

describe('providers', () => {
  it('lists ids, names, kind and colour for a site', async () => {
    const response = await manager.get(`/api/providers?siteId=${aspen}`)
    expect(response.status).toBe(200)
    for (const provider of response.body) {
      expect(provider).toEqual(expect.objectContaining({ id: expect.any(Number), name: expect.any(String), kind: expect.stringMatching(/^(dentist|hygienist)$/), colour: expect.stringMatching(/^#[0-9a-f]{6}$/i) }))
      expect(provider.siteIds).toContain(aspen)
    }
    expect(response.body.length).toBeGreaterThanOrEqual(3)
  })

  it('lets an admin set colour and template categories, naming a bad category', async () => {
    const [provider] = (await admin.get(`/api/providers?siteId=${aspen}`)).body
    const changed = await admin.patch(`/api/providers/${provider.id}`, { colour: '#334155', capabilities: ['hygiene', 'preventive'] })
    expect(changed.body).toMatchObject({ colour: '#334155', capabilities: ['hygiene', 'preventive'] })
    const bad = await admin.patch(`/api/providers/${provider.id}`, { capabilities: ['whitening'] })
    expect(bad.status).toBe(400)
    expect(bad.body.data.field).toBe('capabilities.0')
    expect((await manager.patch(`/api/providers/${provider.id}`, { colour: '#000000' })).status).toBe(403)
    await admin.patch(`/api/providers/${provider.id}`, { colour: provider.colour, capabilities: provider.capabilities })
  })

  it('keeps a front desk to its own site', async () => {
    const desk = await signedInAs('desk.quarry@fernhollow.test')
    expect((await desk.get(`/api/providers?siteId=${aspen}`)).status).toBe(403)
  })
})
