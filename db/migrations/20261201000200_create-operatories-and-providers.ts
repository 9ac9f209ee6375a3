import type { Knex } from 'knex'

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('operatories', (t) => {
    t.increments('id').primary()
    t.integer('site_id').unsigned().notNullable().references('sites.id').onDelete('RESTRICT')
    t.string('name', 80).notNullable()
    t.json('capabilities').notNullable()
    t.boolean('active').notNullable().defaultTo(true)
    t.integer('sort_order').notNullable().defaultTo(0)
    // Written by every booking that touches this chair: the row lock serialises bookings.
    t.bigInteger('booking_seq').unsigned().notNullable().defaultTo(0)
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.unique(['site_id', 'name'])
  })

  await knex.schema.createTable('providers', (t) => {
    t.increments('id').primary()
    t.integer('user_id').unsigned().notNullable().unique().references('users.id').onDelete('RESTRICT')
    t.enu('kind', ['dentist', 'hygienist']).notNullable()
    t.string('colour', 7).notNullable().defaultTo('#2563eb')
    // Template categories this provider performs (restorative, hygiene, exam, ...).
    t.json('capabilities').notNullable()
    t.boolean('active').notNullable().defaultTo(true)
    t.bigInteger('booking_seq').unsigned().notNullable().defaultTo(0)
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('providers')
  await knex.schema.dropTable('operatories')
}
