import type { Knex } from 'knex'

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sites', (t) => {
    t.increments('id').primary()
    t.string('name', 120).notNullable()
    t.string('slug', 60).notNullable().unique()
    t.string('time_zone', 64).notNullable()
    t.string('address', 300).notNullable().defaultTo('')
    t.string('phone', 40).notNullable().defaultTo('')
    t.string('email', 254).notNullable().defaultTo('')
    t.string('colour', 7).notNullable().defaultTo('#4b5563')
    t.tinyint('booking_unit_minutes').unsigned().notNullable().defaultTo(5)
    t.enu('tooth_notation', ['universal', 'iso']).notNullable().defaultTo('universal')
    t.json('opening_hours').notNullable()
    t.json('closed_dates').notNullable()
    t.json('settings').notNullable()
    t.boolean('active').notNullable().defaultTo(true)
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
  })

  await knex.schema.createTable('users', (t) => {
    t.increments('id').primary()
    t.string('email', 254).notNullable().unique()
    t.string('name', 120).notNullable()
    t.string('password_hash', 255).notNullable()
    t.enu('role', ['admin', 'manager', 'front_desk', 'dentist', 'hygienist', 'assistant']).notNullable()
    t.boolean('all_sites').notNullable().defaultTo(false)
    t.boolean('active').notNullable().defaultTo(true)
    // Bumped on sign-out, password change and deactivation: older cookies stop working.
    t.integer('session_version').unsigned().notNullable().defaultTo(1)
    t.datetime('last_sign_in_at', { precision: 3 }).nullable()
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
  })

  await knex.schema.createTable('user_sites', (t) => {
    t.integer('user_id').unsigned().notNullable().references('users.id').onDelete('CASCADE')
    t.integer('site_id').unsigned().notNullable().references('sites.id').onDelete('CASCADE')
    t.primary(['user_id', 'site_id'])
    t.index(['site_id'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('user_sites')
  await knex.schema.dropTable('users')
  await knex.schema.dropTable('sites')
}
