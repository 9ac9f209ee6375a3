import type { Knex } from 'knex'

// A patient may stop e-mail reminders (the one-click link in every reminder, RFC 8058); invitations,
// changes and cancellations keep coming. NULL: reminders on.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('patients', (t) => {
    t.datetime('reminders_off_at', { precision: 3 }).nullable()
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('patients', (t) => {
    t.dropColumn('reminders_off_at')
  })
}
