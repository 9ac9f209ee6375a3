import type { Knex } from 'knex'

// An inbound text is matched to the latest text sent to its number (`lastTextTo`). The number sits in
// the rendered JSON, so that read scanned every sent text (issue 17's known gap). A virtual column
// holds it for texts only (NULL for e-mail, whose rendered form is not JSON), indexed with the id so the
// latest text to a number is one index step.

export async function up(knex: Knex): Promise<void> {
  await knex.raw("ALTER TABLE outbox ADD COLUMN sms_to VARCHAR(64) AS (IF(channel = 'sms', JSON_VALUE(rendered, '$.to'), NULL)) VIRTUAL")
  await knex.raw('ALTER TABLE outbox ADD INDEX outbox_sms_to_idx (sms_to, id)')
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE outbox DROP INDEX outbox_sms_to_idx')
  await knex.raw('ALTER TABLE outbox DROP COLUMN sms_to')
}
