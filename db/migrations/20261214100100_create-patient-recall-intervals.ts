import type { Knex } from 'knex'

// Issue 17 §1: a patient's own recall interval per kind ('cleaning', 'exam'), overriding the site's
// default (`recallMonths` in sites.settings). No row: the site's default applies.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('patient_recall_intervals', (t) => {
    t.integer('patient_id').unsigned().notNullable().references('id').inTable('patients').onDelete('CASCADE')
    t.string('kind', 20).notNullable()
    // Whole months, 1 to 36 (shared/domain/recall.ts RECALL_MONTHS_MIN / MAX)
    t.tinyint('months').unsigned().notNullable()
    t.integer('updated_by').unsigned().nullable().references('id').inTable('users').onDelete('SET NULL')
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.primary(['patient_id', 'kind'])
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('patient_recall_intervals')
}
