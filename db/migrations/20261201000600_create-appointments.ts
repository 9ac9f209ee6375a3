import type { Knex } from 'knex'

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('appointments', (t) => {
    t.increments('id').primary()
    t.integer('site_id').unsigned().notNullable().references('sites.id').onDelete('RESTRICT')
    t.integer('operatory_id').unsigned().notNullable().references('operatories.id').onDelete('RESTRICT')
    t.integer('provider_id').unsigned().notNullable().references('providers.id').onDelete('RESTRICT')
    t.integer('patient_id').unsigned().notNullable().references('patients.id').onDelete('RESTRICT')
    t.datetime('start_utc').notNullable()
    t.datetime('end_utc').notNullable()
    t.enu('state', ['booked', 'confirmed', 'arrived', 'treating', 'finished', 'missed', 'cancelled']).notNullable().defaultTo('booked')
    // The visit plan as booked (template versions, teeth, segments): template edits never change it.
    t.json('plan').notNullable()
    t.string('note', 1000).notNullable().defaultTo('')
    t.string('cancel_reason', 300).nullable()
    t.string('ical_uid', 200).notNullable().unique()
    t.integer('ical_sequence').unsigned().notNullable().defaultTo(0)
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.integer('updated_by').unsigned().nullable().references('users.id').onDelete('SET NULL')
    // Optimistic concurrency for moves and edits.
    t.integer('row_version').unsigned().notNullable().defaultTo(1)
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['site_id', 'start_utc'])
    t.index(['patient_id', 'start_utc'])
    t.index(['provider_id', 'start_utc'])
  })

  // Only live visits keep segments: cancelling deletes them, so conflict checks need no state filter.
  await knex.schema.createTable('appointment_segments', (t) => {
    t.increments('id').primary()
    t.integer('appointment_id').unsigned().notNullable().references('appointments.id').onDelete('CASCADE')
    t.enu('kind', ['hands_on', 'assist', 'numbing', 'reset']).notNullable()
    t.string('label', 120).notNullable()
    t.integer('operatory_id').unsigned().notNullable().references('operatories.id').onDelete('RESTRICT')
    t.integer('provider_id').unsigned().nullable().references('providers.id').onDelete('RESTRICT')
    t.datetime('start_utc').notNullable()
    t.datetime('end_utc').notNullable()
    t.index(['operatory_id', 'start_utc', 'end_utc'])
    t.index(['provider_id', 'kind', 'start_utc', 'end_utc'])
    t.index(['appointment_id'])
  })

  await knex.schema.createTable('idempotency_keys', (t) => {
    t.string('idempotency_key', 100).notNullable()
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE')
    t.string('request_hash', 64).notNullable()
    t.integer('appointment_id').unsigned().nullable().references('appointments.id').onDelete('SET NULL')
    t.json('response').nullable()
    t.smallint('status_code').unsigned().nullable()
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.primary(['user_id', 'idempotency_key'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('idempotency_keys')
  await knex.schema.dropTable('appointment_segments')
  await knex.schema.dropTable('appointments')
}
