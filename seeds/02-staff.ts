// Staff accounts: the demo sign-ins of the glossary, plus generated colleagues.
import { hashPasswordOutsideServer } from '../db/password-hash'
import type { Role } from '../shared/types/auth'
import { DEMO_DOMAIN, DEMO_PASSWORD, type SeedContext } from './context'

interface StaffSeed {
  key: string
  email: string
  role: Role
  sites: string[] | 'all'
  /** Dentists and hygienists only; the provider's kind is the role. */
  provider?: { colour: string; capabilities: string[] }
}

const DENTIST_CAPABILITIES = ['restorative', 'exam', 'surgical', 'prosthodontic', 'preventive']
const HYGIENIST_CAPABILITIES = ['hygiene', 'preventive']

export const DEMO_STAFF: StaffSeed[] = [
  { key: 'admin', email: `admin@${DEMO_DOMAIN}`, role: 'admin', sites: 'all' },
  { key: 'manager', email: `manager@${DEMO_DOMAIN}`, role: 'manager', sites: 'all' },
  { key: 'desk.quarry', email: `desk.quarry@${DEMO_DOMAIN}`, role: 'front_desk', sites: ['quarry-street'] },
  { key: 'desk.aspen', email: `desk.aspen@${DEMO_DOMAIN}`, role: 'front_desk', sites: ['aspen-gulch'] },
  { key: 'desk.saguaro', email: `desk.saguaro@${DEMO_DOMAIN}`, role: 'front_desk', sites: ['saguaro-flats'] },
  { key: 'dentist.main', email: `dentist@${DEMO_DOMAIN}`, role: 'dentist', sites: ['quarry-street', 'saguaro-flats'], provider: { colour: '#1d4ed8', capabilities: DENTIST_CAPABILITIES } },
  { key: 'dentist.2', email: `dentist.two@${DEMO_DOMAIN}`, role: 'dentist', sites: ['aspen-gulch'], provider: { colour: '#be123c', capabilities: DENTIST_CAPABILITIES } },
  { key: 'dentist.3', email: `dentist.three@${DEMO_DOMAIN}`, role: 'dentist', sites: ['quarry-street'], provider: { colour: '#15803d', capabilities: DENTIST_CAPABILITIES } },
  { key: 'dentist.4', email: `dentist.four@${DEMO_DOMAIN}`, role: 'dentist', sites: ['saguaro-flats', 'aspen-gulch'], provider: { colour: '#a16207', capabilities: DENTIST_CAPABILITIES } },
  { key: 'hygienist.main', email: `hygienist@${DEMO_DOMAIN}`, role: 'hygienist', sites: ['aspen-gulch'], provider: { colour: '#0e7490', capabilities: HYGIENIST_CAPABILITIES } },
  { key: 'hygienist.2', email: `hygienist.two@${DEMO_DOMAIN}`, role: 'hygienist', sites: ['quarry-street'], provider: { colour: '#9333ea', capabilities: HYGIENIST_CAPABILITIES } },
  { key: 'hygienist.3', email: `hygienist.three@${DEMO_DOMAIN}`, role: 'hygienist', sites: ['saguaro-flats', 'quarry-street'], provider: { colour: '#c2410c', capabilities: HYGIENIST_CAPABILITIES } },
  { key: 'assistant.1', email: `assistant.one@${DEMO_DOMAIN}`, role: 'assistant', sites: ['quarry-street'] },
  { key: 'assistant.2', email: `assistant.two@${DEMO_DOMAIN}`, role: 'assistant', sites: ['aspen-gulch', 'saguaro-flats'] },
]

export async function seedStaff(ctx: SeedContext): Promise<void> {
  for (const person of DEMO_STAFF) {
    const title = person.role === 'dentist' ? 'Dr. ' : ''
    const name = `${title}${ctx.faker.person.firstName()} ${ctx.faker.person.lastName()}`
    const [userId] = await ctx.db('users').insert({
      email: person.email, name, role: person.role, all_sites: person.sites === 'all',
      password_hash: await hashPasswordOutsideServer(DEMO_PASSWORD),
    })
    const siteSlugs = person.sites === 'all' ? Object.keys(ctx.sites) : person.sites
    await ctx.db('user_sites').insert(siteSlugs.map((slug) => ({ user_id: userId, site_id: ctx.sites[slug] })))
    if (person.provider) {
      const [providerId] = await ctx.db('providers').insert({
        user_id: userId, colour: person.provider.colour,
        capabilities: JSON.stringify(person.provider.capabilities),
      })
      ctx.providers[person.key] = providerId as number
    }
  }
}
