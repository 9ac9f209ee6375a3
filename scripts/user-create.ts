// Create a real staff account: npm run user:create -- --email a@b.org --role admin [--name "…"] [--sites slug,slug]
// Without --password a strong one is generated and printed once. Real passwords have 12+ characters.
import { parseArgs } from 'node:util'
import { randomBytes } from 'node:crypto'
import { hashPasswordOutsideServer } from '../db/password-hash'
import { z } from 'zod'
import { createDb, dbSettingsFromEnv } from '../db/connection'
import { ROLES } from '../shared/types/auth'
import { NewPasswordSchema } from '../shared/schemas/auth'

const { values } = parseArgs({
  options: {
    email: { type: 'string' }, role: { type: 'string' }, name: { type: 'string' },
    password: { type: 'string' }, sites: { type: 'string' },
  },
})

const Args = z.object({
  email: z.string().trim().toLowerCase().email('--email must be an e-mail address'),
  role: z.enum(ROLES, { message: `--role must be one of ${ROLES.join(', ')}` }),
  name: z.string().trim().min(1).default('Administrator'),
  password: NewPasswordSchema.optional(),
  sites: z.string().optional(),
})

const parsed = Args.safeParse(values)
if (!parsed.success) {
  console.error(parsed.error.issues.map((issue) => `${issue.path.join('.') || 'arguments'}: ${issue.message}`).join('\n'))
  process.exit(2)
}
const args = parsed.data
const password = args.password ?? randomBytes(15).toString('base64url')
const allSites = !args.sites && (args.role === 'admin' || args.role === 'manager')

const db = createDb(dbSettingsFromEnv())
try {
  const slugs = args.sites ? args.sites.split(',').map((slug) => slug.trim()) : []
  const sites = slugs.length ? await db('sites').whereIn('slug', slugs).select('id', 'slug') : []
  const missing = slugs.filter((slug) => !sites.some((site: { slug: string }) => site.slug === slug))
  if (missing.length) throw new Error(`unknown site slug(s): ${missing.join(', ')}`)
  if (await db('users').where({ email: args.email }).first()) throw new Error(`${args.email} already exists`)
  const [id] = await db('users').insert({
    email: args.email, name: args.name, role: args.role, all_sites: allSites,
    password_hash: await hashPasswordOutsideServer(password),
  })
  if (sites.length) await db('user_sites').insert(sites.map((site: { id: number }) => ({ user_id: id, site_id: site.id })))
  console.log(`created ${args.role} ${args.email} (id ${id})${allSites ? ' for all sites' : ''}`)
  if (!args.password) console.log(`password (shown once): ${password}`)
} catch (error) {
  console.error(`user:create failed: ${(error as Error).message}`)
  process.exitCode = 1
} finally {
  await db.destroy()
}
