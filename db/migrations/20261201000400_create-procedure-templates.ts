import type { Knex } from 'knex'

// Every edit of a template inserts a new version; appointments snapshot the plan they were
// booked with, so old versions are kept for the record.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('procedure_templates', (t) => {
    t.increments('id').primary()
    t.string('code', 40).notNullable()
    t.integer('version').unsigned().notNullable()
    t.string('name', 120).notNullable()
    t.string('category', 40).notNullable()
    t.string('capability', 40).notNullable()
    // null: inferred from the category (see shared/domain/template-validation.ts).
    t.boolean('needs_tooth').nullable()
    t.boolean('needs_surfaces').nullable()
    t.enu('region', ['anterior', 'posterior']).nullable()
    t.json('steps').notNullable()
    t.json('anaesthesia').notNullable()
    // Only the newest version of a code is current; deactivation hides the whole code.
    t.boolean('is_current').notNullable().defaultTo(true)
    t.boolean('active').notNullable().defaultTo(true)
    t.integer('created_by').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.unique(['code', 'version'])
    t.index(['is_current', 'active'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('procedure_templates')
}
