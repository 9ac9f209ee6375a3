import type { Knex } from 'knex'

// Which dispatcher process sent a message (host and process id), kept in the database for tracing
// instead of in headers patients receive (issue 15: no X-Cuspline-Dispatcher / X-Cuspline-Outbox).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outbox', (t) => {
    t.string('sent_by', 100).nullable()
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outbox', (t) => {
    t.dropColumn('sent_by')
  })
}
