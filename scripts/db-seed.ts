// Seed the demo scenario: `tsx scripts/db-seed.ts` (only into an empty database).
import { createDb, dbSettingsFromEnv } from '../db/connection'
import { isDatabaseEmpty, seedDemo } from '../seeds/index'

const db = createDb(dbSettingsFromEnv())
try {
  if (await isDatabaseEmpty(db)) {
    await seedDemo(db)
    console.log('seeded the Fernhollow Dental Group demo')
  } else {
    console.log('demo seed skipped: the database already has users')
  }
} finally {
  await db.destroy()
}
