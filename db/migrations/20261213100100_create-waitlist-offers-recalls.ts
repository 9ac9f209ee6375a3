import type { Knex } from 'knex'

// Issue 17: the waitlist (patients who want an earlier time), offers of a freed time to them (the
// first to accept gets it), and recall due dates per patient and kind.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('waitlist_entries', (t) => {
    t.increments('id').primary()
    t.integer('patient_id').unsigned().notNullable().references('id').inTable('patients').onDelete('CASCADE')
    // The site whose front desk keeps the entry (site scope); site_ids are the sites the patient accepts.
    t.integer('site_id').unsigned().notNullable().references('id').inTable('sites')
    t.json('site_ids').notNullable()
    // The visit plan's items exactly as the booking drawer sends them.
    t.json('items').notNullable()
    t.date('from_date').notNullable()
    t.date('to_date').notNullable()
    // 'any', 'morning' or 'afternoon' (shared/types/openings.ts PartOfDay)
    t.string('part_of_day', 12).notNullable().defaultTo('any')
    t.integer('notice_minutes').unsigned().notNullable().defaultTo(120)
    // 1 (first) to 5
    t.tinyint('priority').unsigned().notNullable().defaultTo(3)
    t.string('note', 500).notNullable().defaultTo('')
    t.enu('state', ['open', 'booked', 'closed']).notNullable().defaultTo('open')
    t.integer('booked_visit_id').unsigned().nullable().references('id').inTable('visits').onDelete('SET NULL')
    t.string('closed_reason', 300).nullable()
    t.integer('created_by').unsigned().nullable().references('id').inTable('users').onDelete('SET NULL')
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('closed_at', { precision: 3 }).nullable()
    t.index(['state', 'site_id'])
    t.index(['patient_id', 'state'])
  })
  await knex.schema.createTable('offers', (t) => {
    t.increments('id').primary()
    t.integer('entry_id').unsigned().notNullable().references('id').inTable('waitlist_entries').onDelete('CASCADE')
    t.integer('site_id').unsigned().notNullable().references('id').inTable('sites')
    t.integer('operatory_id').unsigned().notNullable().references('id').inTable('operatories')
    t.integer('provider_id').unsigned().notNullable().references('id').inTable('providers')
    t.datetime('start_utc', { precision: 3 }).notNullable()
    t.datetime('end_utc', { precision: 3 }).notNullable()
    // Random part signed into the offer's link (server/utils/offer-token.ts).
    t.string('nonce', 64).notNullable()
    t.datetime('expires_at', { precision: 3 }).notNullable()
    // sent → accepted | taken (another patient accepted) | expired | refused (the patient said no)
    t.enu('state', ['sent', 'accepted', 'taken', 'expired', 'refused']).notNullable().defaultTo('sent')
    t.integer('visit_id').unsigned().nullable().references('id').inTable('visits').onDelete('SET NULL')
    t.integer('created_by').unsigned().nullable().references('id').inTable('users').onDelete('SET NULL')
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('answered_at', { precision: 3 }).nullable()
    t.index(['entry_id'])
    t.index(['site_id', 'start_utc'])
  })
  await knex.schema.createTable('recalls', (t) => {
    t.increments('id').primary()
    t.integer('patient_id').unsigned().notNullable().references('id').inTable('patients').onDelete('CASCADE')
    // 'cleaning' or 'exam'
    t.string('kind', 20).notNullable()
    t.date('due_date').notNullable()
    t.integer('booked_visit_id').unsigned().nullable().references('id').inTable('visits').onDelete('SET NULL')
    t.datetime('last_contact_at', { precision: 3 }).nullable()
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.unique(['patient_id', 'kind'])
    t.index(['due_date'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('recalls')
  await knex.schema.dropTable('offers')
  await knex.schema.dropTable('waitlist_entries')
}
