import type { Knex } from 'knex'

// A provider's kind (dentist or hygienist) was held twice: `users.role` and `providers.kind`, and a
// role change left the second behind. The role is now the one source: repositories join `users` and
// read `users.role`. A provider row whose account is no longer a dentist or hygienist is kept (its
// past visits and shifts point at it) but is inactive and no longer listed as a provider.

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('providers', (t) => {
    t.dropColumn('kind')
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw("ALTER TABLE providers ADD COLUMN kind ENUM('dentist', 'hygienist') NULL AFTER user_id")
  // A provider row of an account that is no longer a provider gets 'dentist': the old column had no empty value.
  await knex.raw(`UPDATE providers p JOIN users u ON u.id = p.user_id
    SET p.kind = IF(u.role IN ('dentist', 'hygienist'), u.role, 'dentist')`)
  await knex.raw("ALTER TABLE providers MODIFY kind ENUM('dentist', 'hygienist') NOT NULL")
}
