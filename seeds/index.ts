// The demo scenario, seeded in order inside one transaction: all of it or nothing.
import type { Knex } from 'knex'
import { demoFaker, type SeedContext } from './context'
import { seedSites } from './01-sites'
import { seedStaff } from './02-staff'
import { seedRota } from './03-rota'
import { seedTemplates } from './04-templates'
import { seedPatients } from './05-patients'
import { seedWaitlistAndRecall } from './06-waitlist-and-recall'

export async function isDatabaseEmpty(db: Knex): Promise<boolean> {
  const row = await db('users').count({ count: '*' }).first()
  return Number(row?.count ?? 0) === 0
}

export async function seedDemo(db: Knex): Promise<void> {
  await db.transaction(async (trx) => {
    const ctx: SeedContext = { db: trx, faker: demoFaker(), sites: {}, operatories: {}, providers: {} }
    await seedSites(ctx)
    await seedStaff(ctx)
    await seedRota(ctx)
    await seedTemplates(ctx)
    await seedPatients(ctx)
    await seedWaitlistAndRecall(ctx)
  })
}
