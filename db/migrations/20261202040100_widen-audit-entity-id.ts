import type { Knex } from 'knex'

// A failed sign-in is audited with the e-mail that was typed as its entity id. E-mail addresses may be
// up to 254 characters (RFC 5321 §4.5.3.1.3 path limit, less the angle brackets; the same bound as
// users.email, sign_in_attempts.email and the sign-in schema), so entity_id must hold 254, not 60:
// a 70-character address used to fail the audit insert and answer 500.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('audit_log', (t) => {
    t.string('entity_id', 254).nullable().alter()
  })
}

export async function down(knex: Knex): Promise<void> {
  // Longer ids would not fit back into 60 characters; cut them rather than fail the rollback.
  await knex('audit_log').whereRaw('CHAR_LENGTH(entity_id) > 60').update({ entity_id: knex.raw('LEFT(entity_id, 60)') })
  await knex.schema.alterTable('audit_log', (t) => {
    t.string('entity_id', 60).nullable().alter()
  })
}
