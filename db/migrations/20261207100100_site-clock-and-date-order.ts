import type { Knex } from 'knex'

// Issue 14 (dates, times and words): each site chooses how its screens, e-mails and prints show
// times and dates. `clock` is '12h' (9:05 AM) or '24h' (09:05); `date_order` is the order of the
// numeric date (month-day-year 09/13/1973, day-month-year 13/09/1973, year-month-day 1973-09-13).
// Defaults suit a US practice.

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('sites', (t) => {
    t.enu('clock', ['12h', '24h']).notNullable().defaultTo('12h')
    t.enu('date_order', ['month-day-year', 'day-month-year', 'year-month-day']).notNullable().defaultTo('month-day-year')
  })
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('sites', (t) => {
    t.dropColumn('date_order')
    t.dropColumn('clock')
  })
}
