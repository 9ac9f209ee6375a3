import type { Knex } from 'knex'

// Shifts, their exceptions and blocks hold local wall times and dates in the site's zone;
// they are expanded to UTC intervals in shared/domain (DST-safe).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('shifts', (t) => {
    t.increments('id').primary()
    t.integer('provider_id').unsigned().notNullable().references('providers.id').onDelete('CASCADE')
    t.integer('site_id').unsigned().notNullable().references('sites.id').onDelete('CASCADE')
    t.string('rrule', 500).notNullable()
    t.date('valid_from').notNullable()
    t.date('valid_until').nullable()
    t.string('local_start', 5).notNullable()
    t.string('local_end', 5).notNullable()
    t.string('note', 200).notNullable().defaultTo('')
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['provider_id', 'valid_from'])
    t.index(['site_id'])
  })

  await knex.schema.createTable('shift_exceptions', (t) => {
    t.increments('id').primary()
    t.integer('provider_id').unsigned().notNullable().references('providers.id').onDelete('CASCADE')
    t.integer('site_id').unsigned().nullable().references('sites.id').onDelete('CASCADE')
    t.enu('kind', ['time_off', 'extra']).notNullable()
    t.date('start_date').notNullable()
    t.date('end_date').notNullable()
    t.string('local_start', 5).nullable()
    t.string('local_end', 5).nullable()
    t.string('reason', 200).notNullable().defaultTo('')
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['provider_id', 'start_date'])
  })

  await knex.schema.createTable('blocks', (t) => {
    t.increments('id').primary()
    t.integer('site_id').unsigned().notNullable().references('sites.id').onDelete('CASCADE')
    t.integer('operatory_id').unsigned().nullable().references('operatories.id').onDelete('CASCADE')
    t.integer('provider_id').unsigned().nullable().references('providers.id').onDelete('CASCADE')
    t.date('start_date').notNullable()
    t.string('local_start', 5).notNullable()
    t.string('local_end', 5).notNullable()
    t.string('rrule', 500).nullable()
    t.date('until_date').nullable()
    t.string('reason', 200).notNullable()
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['site_id', 'start_date'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('blocks')
  await knex.schema.dropTable('shift_exceptions')
  await knex.schema.dropTable('shifts')
}
