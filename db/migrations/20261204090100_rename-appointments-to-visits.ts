import type { Knex } from 'knex'

// One name per concept (issue 12 §1): a patient's booked time is a `visit` everywhere, so the tables
// `appointments` and `appointment_segments` become `visits` and `visit_segments`, every
// `appointment_id` column becomes `visit_id`, and foreign keys and indexes get the matching names.
// Stored JSON written before the rename (outbox payloads, idempotent answers, audit before/after) has
// its `appointmentId` keys renamed to `visitId`, and old audit rows on entity `appointment` move to
// entity `visit`. Patient links already sent keep working: the signed token never named the field.

type Words = Array<[from: string, to: string]>

const UP_WORDS: Words = [['appointment_segments', 'visit_segments'], ['appointments', 'visits'], ['appointment_id', 'visit_id']]
const DOWN_WORDS: Words = [['visit_segments', 'appointment_segments'], ['visits', 'appointments'], ['visit_id', 'appointment_id']]
const JSON_COLUMNS: Array<[table: string, column: string]> = [['outbox', 'payload'], ['idempotency_keys', 'response'], ['audit_log', 'before'], ['audit_log', 'after']]

function renamed(name: string, words: Words): string {
  return words.reduce((text, [from, to]) => text.split(from).join(to), name)
}

interface ForeignKey { table: string; name: string; column: string; parent: string; onDelete: string }

async function rowsOf<T>(knex: Knex, sql: string): Promise<T[]> {
  const [rows] = await knex.raw(sql)
  return rows as T[]
}

/** Renames every foreign key, `…_id` column and index that carries one of the old words. */
async function renameKeysAndColumns(knex: Knex, words: Words, oldColumn: string): Promise<void> {
  const oldWords = words.map(([from]) => from)
  const mentions = (name: string) => oldWords.some((word) => name.includes(word))
  const keys = await rowsOf<ForeignKey>(knex, `SELECT k.TABLE_NAME AS \`table\`, k.CONSTRAINT_NAME AS name, k.COLUMN_NAME AS \`column\`,
      k.REFERENCED_TABLE_NAME AS parent, r.DELETE_RULE AS onDelete
    FROM information_schema.KEY_COLUMN_USAGE k JOIN information_schema.REFERENTIAL_CONSTRAINTS r
      ON r.CONSTRAINT_SCHEMA = k.CONSTRAINT_SCHEMA AND r.CONSTRAINT_NAME = k.CONSTRAINT_NAME AND r.TABLE_NAME = k.TABLE_NAME
    WHERE k.TABLE_SCHEMA = DATABASE() AND k.REFERENCED_TABLE_NAME IS NOT NULL`)
  const touched = keys.filter((key) => mentions(key.name) || key.column === oldColumn)
  for (const key of touched) await knex.raw('ALTER TABLE ?? DROP FOREIGN KEY ??', [key.table, key.name])
  const columns = await rowsOf<{ table: string }>(knex, `SELECT TABLE_NAME AS \`table\` FROM information_schema.COLUMNS
    WHERE TABLE_SCHEMA = DATABASE() AND COLUMN_NAME = '${oldColumn}'`)
  for (const { table } of columns) await knex.raw('ALTER TABLE ?? RENAME COLUMN ?? TO ??', [table, oldColumn, renamed(oldColumn, words)])
  const indexes = await rowsOf<{ table: string; name: string }>(knex, `SELECT DISTINCT TABLE_NAME AS \`table\`, INDEX_NAME AS name
    FROM information_schema.STATISTICS WHERE TABLE_SCHEMA = DATABASE()`)
  for (const index of indexes.filter((i) => mentions(i.name))) {
    await knex.raw('ALTER TABLE ?? RENAME INDEX ?? TO ??', [index.table, index.name, renamed(index.name, words)])
  }
  for (const key of touched) {
    const column = key.column === oldColumn ? renamed(oldColumn, words) : key.column
    await knex.raw(`ALTER TABLE ?? ADD CONSTRAINT ?? FOREIGN KEY (??) REFERENCES ?? (id) ON DELETE ${key.onDelete}`,
      [key.table, renamed(key.name, words), column, key.parent])
  }
}

async function renameJsonKeys(knex: Knex, from: string, to: string): Promise<void> {
  for (const [table, column] of JSON_COLUMNS) {
    await knex.raw('UPDATE ?? SET ?? = REPLACE(??, ?, ?) WHERE ?? LIKE ?', [table, column, column, `"${from}":`, `"${to}":`, column, `%"${from}":%`])
  }
}

export async function up(knex: Knex): Promise<void> {
  await knex.raw('RENAME TABLE appointments TO visits, appointment_segments TO visit_segments')
  await renameKeysAndColumns(knex, UP_WORDS, 'appointment_id')
  await renameJsonKeys(knex, 'appointmentId', 'visitId')
  await knex('audit_log').where({ entity: 'appointment' }).update({ entity: 'visit' })
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('RENAME TABLE visits TO appointments, visit_segments TO appointment_segments')
  await renameKeysAndColumns(knex, DOWN_WORDS, 'visit_id')
  await renameJsonKeys(knex, 'visitId', 'appointmentId')
}
