import type { Knex } from 'knex'

// Idempotency keys are opaque strings chosen by the client: "Abc-123" and "abc-123" are two keys,
// two bookings. The table's default collation (utf8mb4_unicode_ci) compared them without case, so a
// second, different booking whose key differed only in case was refused with 409. A binary
// collation compares them byte for byte. The column stays part of the primary key (user_id, key).

export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE idempotency_keys MODIFY idempotency_key VARCHAR(100) CHARACTER SET utf8mb4 COLLATE utf8mb4_bin NOT NULL')
}

export async function down(knex: Knex): Promise<void> {
  // Keys that differ only in case would collide under the old collation: keep the first of each.
  await knex.raw(`DELETE k FROM idempotency_keys k JOIN idempotency_keys o
    ON o.user_id = k.user_id AND o.idempotency_key COLLATE utf8mb4_unicode_ci = k.idempotency_key COLLATE utf8mb4_unicode_ci
    AND (o.created_at < k.created_at OR (o.created_at = k.created_at AND o.idempotency_key < k.idempotency_key))`)
  await knex.raw('ALTER TABLE idempotency_keys MODIFY idempotency_key VARCHAR(100) CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci NOT NULL')
}
