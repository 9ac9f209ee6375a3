import type { Knex } from 'knex'

// Issue 13 §3/§4: a site's "late after" minutes; on visits the state before the last change and when
// it was made (so the last change can be undone on the same local day), and when the anaesthetic was
// given (the numbing countdown runs from it, never from the plan).

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('sites', (t) => {
    t.integer('late_after_minutes').unsigned().notNullable().defaultTo(10)
  })
  await knex.schema.alterTable('visits', (t) => {
    t.enu('previous_state', ['booked', 'confirmed', 'arrived', 'treating', 'finished', 'missed', 'cancelled']).nullable()
    t.datetime('state_changed_at', { precision: 3 }).nullable()
    t.datetime('anaesthetic_given_at', { precision: 3 }).nullable()
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('visits', (t) => {
    t.dropColumn('anaesthetic_given_at')
    t.dropColumn('state_changed_at')
    t.dropColumn('previous_state')
  })
  await knex.schema.alterTable('sites', (t) => {
    t.dropColumn('late_after_minutes')
  })
}
