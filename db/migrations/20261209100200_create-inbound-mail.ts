import type { Knex } from 'knex'

// Calendar replies (iTIP REPLY, RFC 5546 §3.2.3) posted by the inbound-mail service: one row per
// delivery, so a replayed delivery id is refused, and what matched nothing stays visible on the
// Outbox screen instead of being dropped.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('inbound_mail', (t) => {
    t.bigIncrements('id')
    t.string('delivery_id', 100).notNullable().unique()
    t.datetime('received_at', { precision: 3 }).notNullable()
    t.integer('site_id').unsigned().nullable().references('id').inTable('sites').onDelete('SET NULL')
    t.integer('visit_id').unsigned().nullable().references('id').inTable('visits').onDelete('SET NULL')
    // matched, ignored (older SEQUENCE, nothing to do) or unmatched
    t.string('outcome', 20).notNullable()
    t.string('partstat', 20).nullable()
    t.string('sender', 320).nullable()
    t.string('subject', 500).nullable()
    t.string('note', 500).notNullable().defaultTo('')
    t.text('raw', 'mediumtext').notNullable()
    t.index(['outcome', 'received_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('inbound_mail')
}
