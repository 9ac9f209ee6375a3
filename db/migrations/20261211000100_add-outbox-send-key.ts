import type { Knex } from 'knex'

// The send intent of an outbox row (issue 19 §2): a random key given when the row is first claimed
// and kept through every later claim, retry and take-over. The message's Message-ID is built from it,
// so a copy sent again after a dispatcher died between the SMTP server's acceptance and the 'sent'
// record carries the same, globally unique ID, and a server that keeps one message per ID (the
// local mail catcher does) delivers it once. Outbox ids alone repeat when a database is rebuilt.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outbox', (t) => {
    t.specificType('send_key', 'CHAR(32)').nullable()
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('outbox', (t) => {
    t.dropColumn('send_key')
  })
}
