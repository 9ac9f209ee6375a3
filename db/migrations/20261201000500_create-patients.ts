import type { Knex } from 'knex'

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('patients', (t) => {
    t.increments('id').primary()
    t.string('first_name', 80).notNullable()
    t.string('last_name', 80).notNullable()
    t.date('date_of_birth').notNullable()
    t.string('email', 254).nullable()
    t.string('phone', 40).nullable()
    t.integer('preferred_site_id').unsigned().nullable().references('sites.id').onDelete('SET NULL')
    t.boolean('email_consent').notNullable().defaultTo(false)
    t.string('notes', 1000).notNullable().defaultTo('')
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['last_name', 'first_name'])
    t.index(['date_of_birth'])
    t.index(['email'])
    t.index(['phone'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('patients')
}
