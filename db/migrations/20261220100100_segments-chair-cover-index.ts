import type { Knex } from 'knex'

// Reads of a chair's segments over a range (Balance, openings, the day's board) want the kind and the
// provider too: with them in the chair index those reads never open the segment rows (issue 19 §3:
// a week of all 400 chairs at group scale is 77,000 segments, each a lookup into the table without
// it). The wider index replaces the old one, whose columns are its first three.

const OLD = ['operatory_id', 'start_utc', 'end_utc']
const COVER = [...OLD, 'kind', 'provider_id']

export async function up(knex: Knex): Promise<void> {
  // Added before the old one goes: the chair's foreign key needs an index starting with operatory_id.
  await knex.schema.alterTable('visit_segments', (t) => {
    t.index(COVER, 'visit_segments_chair_cover_idx')
  })
  await knex.schema.alterTable('visit_segments', (t) => {
    t.dropIndex(OLD)
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('visit_segments', (t) => {
    t.index(OLD)
  })
  await knex.schema.alterTable('visit_segments', (t) => {
    t.dropIndex(COVER, 'visit_segments_chair_cover_idx')
  })
}
