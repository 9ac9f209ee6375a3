import type { Knex } from 'knex'

// A visit stranded by a change of the rota, a room, a provider, the site's hours or a template (issue
// 13): it keeps its place, and `stranded_reason` says in plain words why it no longer holds; the
// Rebook list reads the open ones. Moving it to a time that holds, or cancelling it, clears both.

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('visits', (t) => {
    t.string('stranded_reason', 300).nullable()
    t.datetime('stranded_at', { precision: 3 }).nullable()
    t.index(['site_id', 'stranded_at'], 'visits_site_stranded_idx')
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('visits', (t) => {
    t.dropIndex(['site_id', 'stranded_at'], 'visits_site_stranded_idx')
    t.dropColumn('stranded_at')
    t.dropColumn('stranded_reason')
  })
}
