import type { Knex } from 'knex'

// Issue 17 §3: a move offer — Balance's "consolidate" suggestion e-mailed to the patient, who may move
// the visit to the proposed time or keep the current one. The visit moves only when the patient accepts.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('move_offers', (t) => {
    t.increments('id').primary()
    t.integer('visit_id').unsigned().notNullable().references('id').inTable('visits').onDelete('CASCADE')
    t.integer('site_id').unsigned().notNullable().references('id').inTable('sites')
    t.integer('operatory_id').unsigned().notNullable().references('id').inTable('operatories')
    t.integer('provider_id').unsigned().notNullable().references('id').inTable('providers')
    // The visit's time when the offer was sent, and the time proposed.
    t.datetime('from_start_utc', { precision: 3 }).notNullable()
    t.datetime('start_utc', { precision: 3 }).notNullable()
    t.datetime('end_utc', { precision: 3 }).notNullable()
    // Random part signed into the link (server/utils/offer-token.ts, with its own purpose string).
    t.string('nonce', 64).notNullable()
    t.datetime('expires_at', { precision: 3 }).notNullable()
    // sent → accepted | declined | expired | taken (the time was no longer free when accepted)
    t.enu('state', ['sent', 'accepted', 'declined', 'expired', 'taken']).notNullable().defaultTo('sent')
    t.integer('created_by').unsigned().nullable().references('id').inTable('users').onDelete('SET NULL')
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('answered_at', { precision: 3 }).nullable()
    t.index(['visit_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('move_offers')
}
