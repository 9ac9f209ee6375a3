import type { Knex } from 'knex'

// Patient e-mail: a visit can carry the patient's request to cancel (from the signed link), and an
// outbox row keeps the message exactly as it was sent (subject, text, HTML, .ics) for the Outbox screen.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('appointments', (t) => {
    t.datetime('cancel_requested_at', { precision: 3 }).nullable()
    t.datetime('confirmed_at', { precision: 3 }).nullable()
  })
  await knex.schema.alterTable('outbox', (t) => {
    t.text('rendered', 'longtext').nullable()
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outbox', (t) => {
    t.dropColumn('rendered')
  })
  await knex.schema.alterTable('appointments', (t) => {
    t.dropColumn('confirmed_at')
    t.dropColumn('cancel_requested_at')
  })
}
