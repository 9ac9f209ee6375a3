import type { Knex } from 'knex'

// Patient e-mails are written here in the booking transaction and sent later by a dispatcher.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('outbox', (t) => {
    t.bigIncrements('id').primary()
    t.string('kind', 40).notNullable()
    t.integer('appointment_id').unsigned().nullable().references('appointments.id').onDelete('SET NULL')
    t.integer('site_id').unsigned().nullable().references('sites.id').onDelete('SET NULL')
    t.json('payload').notNullable()
    t.datetime('due_at', { precision: 3 }).notNullable()
    t.enu('state', ['queued', 'sending', 'sent', 'failed', 'skipped']).notNullable().defaultTo('queued')
    t.integer('attempts').unsigned().notNullable().defaultTo(0)
    t.string('last_error', 1000).nullable()
    // A claimed row whose sender died is claimed again after its lease.
    t.datetime('lease_until', { precision: 3 }).nullable()
    t.string('message_id', 300).nullable()
    t.datetime('sent_at', { precision: 3 }).nullable()
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['state', 'due_at'])
    t.index(['appointment_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('outbox')
}
