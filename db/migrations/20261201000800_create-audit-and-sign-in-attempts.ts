import type { Knex } from 'knex'

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('audit_log', (t) => {
    t.bigIncrements('id').primary()
    t.integer('user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.string('action', 60).notNullable()
    t.string('entity', 60).notNullable()
    t.string('entity_id', 60).nullable()
    t.json('before').nullable()
    t.json('after').nullable()
    t.string('ip', 64).nullable()
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['entity', 'entity_id'])
    t.index(['created_at'])
  })

  // Kept in the database so limits hold across app instances and restarts.
  await knex.schema.createTable('sign_in_attempts', (t) => {
    t.bigIncrements('id').primary()
    t.string('email', 254).notNullable()
    t.string('ip', 64).notNullable()
    t.boolean('succeeded').notNullable()
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.index(['email', 'created_at'])
    t.index(['ip', 'created_at'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sign_in_attempts')
  await knex.schema.dropTable('audit_log')
}
