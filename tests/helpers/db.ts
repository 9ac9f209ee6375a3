// Direct database access for test set-up and checks (the real MariaDB, never a mock).
import { randomUUID } from 'node:crypto'
import type { Knex } from 'knex'
import { createDb, dbSettingsFromEnv } from '../../db/connection'
import { hashPasswordOutsideServer } from '../../db/password-hash'
import type { Role } from '../../shared/types/auth'

let shared: Knex | undefined
export function testDb(): Knex {
  shared ??= createDb(dbSettingsFromEnv())
  return shared
}

export async function closeTestDb(): Promise<void> {
  await shared?.destroy()
  shared = undefined
}

export async function siteIdBySlug(slug: string): Promise<number> {
  const row = await testDb()('sites').where({ slug }).first('id')
  if (!row) throw new Error(`no site ${slug}`)
  return row.id
}

/** A throwaway staff account, so tests that lock or deactivate never touch the demo sign-ins. */
export async function createTestUser(options: { role?: Role; siteSlugs?: string[]; password?: string } = {}) {
  const email = `test-${randomUUID()}@fernhollow.test`
  const password = options.password ?? 'a-long-test-password'
  const [id] = await testDb()('users').insert({
    email, name: 'Test Person', role: options.role ?? 'front_desk', all_sites: false,
    password_hash: await hashPasswordOutsideServer(password),
  })
  for (const slug of options.siteSlugs ?? ['quarry-street']) {
    await testDb()('user_sites').insert({ user_id: id, site_id: await siteIdBySlug(slug) })
  }
  return { id: id as number, email, password }
}
