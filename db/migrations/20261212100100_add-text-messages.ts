import type { Knex } from 'knex'

// Text messages beside e-mail (issue 18): an outbox row has a channel ('email' or 'sms') and, for
// texts, the service's delivery status; patients have an opt-out instant (STOP/START replies; their
// text consent is `patients.sms_consent`, migration 20261210100100); replies from patients are kept in sms_replies for the front desk.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outbox', (t) => {
    t.string('channel', 10).notNullable().defaultTo('email')
    // The service's last reported status of a text: queued, sent, delivered, failed, undelivered.
    t.string('provider_status', 20).nullable()
    t.index(['message_id'], 'outbox_message_id_index')
  })
  await knex.schema.alterTable('patients', (t) => {
    t.datetime('sms_opted_out_at', { precision: 3 }).nullable()
  })
  await knex.schema.createTable('sms_replies', (t) => {
    t.bigIncrements('id').primary()
    // The service's id of the incoming text: a webhook delivered twice is kept once.
    t.string('message_sid', 64).notNullable().unique()
    t.string('from_number', 20).notNullable()
    t.string('body', 1600).notNullable()
    t.integer('patient_id').unsigned().nullable().references('patients.id').onDelete('SET NULL')
    t.integer('visit_id').unsigned().nullable().references('visits.id').onDelete('SET NULL')
    t.integer('site_id').unsigned().nullable().references('sites.id').onDelete('SET NULL')
    // confirmed, cancel_requested, cancelled, opted_out, opted_in, unanswered, no_visit, unknown_number
    t.string('outcome', 20).notNullable()
    t.datetime('answered_at', { precision: 3 }).nullable()
    t.integer('answered_by').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.datetime('received_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['site_id', 'outcome', 'answered_at'])
    t.index(['visit_id'])
    t.index(['patient_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sms_replies')
  await knex.schema.alterTable('patients', (t) => {
    t.dropColumn('sms_opted_out_at')
  })
  await knex.schema.alterTable('outbox', (t) => {
    t.dropIndex(['message_id'], 'outbox_message_id_index')
    t.dropColumn('provider_status')
    t.dropColumn('channel')
  })
}
