import type { Knex } from 'knex'
import { parsePhoneNumberFromString } from 'libphonenumber-js'

// Patient records (issue 16): preferred name, postal address, consent per channel with date and
// source, a guardian, the front desk's note, an alert, a row version; merges and imports.
// Phones become E.164 (stored as entered before): numbers that do not parse (US default) are kept.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('patients', (t) => {
    t.string('preferred_name', 80).nullable()
    t.string('address_street', 200).nullable()
    t.string('address_city', 100).nullable()
    t.string('address_region', 100).nullable()
    t.string('address_postal_code', 20).nullable()
    t.datetime('email_consent_at', { precision: 3 }).nullable()
    t.string('email_consent_source', 60).nullable()
    t.boolean('sms_consent').notNullable().defaultTo(false)
    t.datetime('sms_consent_at', { precision: 3 }).nullable()
    t.string('sms_consent_source', 60).nullable()
    t.string('guardian_name', 160).nullable()
    t.string('guardian_email', 254).nullable()
    t.string('guardian_phone', 20).nullable()
    t.string('alert_text', 120).nullable()
    t.integer('row_version').unsigned().notNullable().defaultTo(1)
    t.integer('merged_into_id').unsigned().nullable().references('patients.id').onDelete('SET NULL')
  })
  const rows = await knex('patients').whereNotNull('phone').select('id', 'phone')
  for (const row of rows as { id: number; phone: string }[]) {
    const parsed = parsePhoneNumberFromString(row.phone, 'US')
    if (parsed?.isValid() && parsed.number !== row.phone) await knex('patients').where({ id: row.id }).update({ phone: parsed.number })
  }

  await knex.schema.createTable('patient_merges', (t) => {
    t.increments('id').primary()
    t.integer('survivor_id').unsigned().notNullable().references('patients.id').onDelete('CASCADE')
    t.integer('merged_id').unsigned().notNullable().references('patients.id').onDelete('CASCADE')
    t.integer('user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.json('choices').notNullable()
    t.json('merged_before').notNullable()
    t.json('survivor_before').notNullable()
    t.json('moved').notNullable()
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.unique(['merged_id'])
  })

  await knex.schema.createTable('patient_imports', (t) => {
    t.increments('id').primary()
    t.integer('site_id').unsigned().notNullable().references('sites.id').onDelete('CASCADE')
    t.integer('user_id').unsigned().nullable().references('users.id').onDelete('SET NULL')
    t.string('file_name', 200).notNullable()
    t.specificType('checksum', 'CHAR(64)').notNullable()
    t.text('content', 'longtext').notNullable()
    t.enu('state', ['uploaded', 'imported']).notNullable().defaultTo('uploaded')
    t.json('report').nullable()
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
    t.datetime('imported_at', { precision: 3 }).nullable()
    t.index(['site_id', 'checksum'])
  })

  // The column mapping last used at a site, offered again for its next file.
  await knex.schema.createTable('patient_import_mappings', (t) => {
    t.integer('site_id').unsigned().primary().references('sites.id').onDelete('CASCADE')
    t.json('mapping').notNullable()
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3))
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('patient_import_mappings')
  await knex.schema.dropTable('patient_imports')
  await knex.schema.dropTable('patient_merges')
  await knex.schema.alterTable('patients', (t) => {
    t.dropForeign(['merged_into_id'])
    for (const column of ['merged_into_id', 'row_version', 'alert_text', 'guardian_phone', 'guardian_email', 'guardian_name',
      'sms_consent_source', 'sms_consent_at', 'sms_consent', 'email_consent_source', 'email_consent_at', 'address_postal_code',
      'address_region', 'address_city', 'address_street', 'preferred_name']) t.dropColumn(column)
  })
}
