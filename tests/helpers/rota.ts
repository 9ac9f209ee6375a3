// Rota test set-up against the real database: provider ids of demo people, throwaway providers.
import { testDb, createTestUser } from './db'

export async function providerIdByEmail(email: string): Promise<number> {
  const row = await testDb()('providers as p').join('users as u', 'u.id', 'p.user_id').where('u.email', email).first('p.id')
  if (!row) throw new Error(`no provider for ${email}`)
  return row.id
}

/** A new dentist with no shifts, so clash and grid checks start from a clean rota. */
export async function createTestProvider(siteSlugs: string[], name = 'Dr. Test Provider') {
  const user = await createTestUser({ role: 'dentist', siteSlugs })
  await testDb()('users').where({ id: user.id }).update({ name })
  const [providerId] = await testDb()('providers').insert({ user_id: user.id, colour: '#0f766e', capabilities: JSON.stringify(['restorative']) })
  return { ...user, name, providerId: providerId as number }
}
