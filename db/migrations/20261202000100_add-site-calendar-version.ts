import type { Knex } from 'knex'

// sites.calendar_version changes whenever a site's rooms, shifts, shift exceptions or blocks do, so
// each app process can keep a site's calendar in memory and reload it only when the number moves
// (server/repositories/site-calendar.ts). Triggers do the counting, so no write path can forget it,
// whichever script, seed or service writes. The site row itself is read fresh on every booking.
// (Rows removed by a foreign-key cascade fire no trigger; rooms and providers are deactivated, not
// deleted, so that only matters when a whole site goes, and then its calendar goes with it.)

const TRIGGERS: Array<{ name: string; table: string; event: 'INSERT' | 'UPDATE' | 'DELETE'; body: string }> = []

function bump(siteExpression: string): string {
  return `UPDATE sites SET calendar_version = calendar_version + 1 WHERE id = ${siteExpression}`
}

// Shift exceptions with no site apply at every site.
function bumpException(row: 'NEW' | 'OLD'): string {
  return `UPDATE sites SET calendar_version = calendar_version + 1 WHERE ${row}.site_id IS NULL OR id = ${row}.site_id`
}

for (const table of ['shifts', 'blocks']) {
  TRIGGERS.push(
    { name: `${table}_after_insert_calendar`, table, event: 'INSERT', body: bump('NEW.site_id') },
    { name: `${table}_after_update_calendar`, table, event: 'UPDATE', body: `BEGIN ${bump('NEW.site_id')}; IF NOT (OLD.site_id <=> NEW.site_id) THEN ${bump('OLD.site_id')}; END IF; END` },
    { name: `${table}_after_delete_calendar`, table, event: 'DELETE', body: bump('OLD.site_id') },
  )
}
TRIGGERS.push(
  { name: 'shift_exceptions_after_insert_calendar', table: 'shift_exceptions', event: 'INSERT', body: bumpException('NEW') },
  { name: 'shift_exceptions_after_update_calendar', table: 'shift_exceptions', event: 'UPDATE', body: `BEGIN ${bumpException('NEW')}; IF NOT (OLD.site_id <=> NEW.site_id) THEN ${bumpException('OLD')}; END IF; END` },
  { name: 'shift_exceptions_after_delete_calendar', table: 'shift_exceptions', event: 'DELETE', body: bumpException('OLD') },
  { name: 'operatories_after_insert_calendar', table: 'operatories', event: 'INSERT', body: bump('NEW.site_id') },
  {
    // Every booking writes booking_seq to lock the room: that alone must not count as a change.
    name: 'operatories_after_update_calendar', table: 'operatories', event: 'UPDATE',
    body: `BEGIN IF NOT (OLD.site_id <=> NEW.site_id AND OLD.name <=> NEW.name AND OLD.active <=> NEW.active
      AND OLD.capabilities <=> NEW.capabilities AND OLD.sort_order <=> NEW.sort_order) THEN
      ${bump('NEW.site_id')}; ${bump('OLD.site_id')}; END IF; END`,
  },
  { name: 'operatories_after_delete_calendar', table: 'operatories', event: 'DELETE', body: bump('OLD.site_id') },
)

export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('sites', (t) => {
    t.integer('calendar_version').unsigned().notNullable().defaultTo(0)
  })
  for (const trigger of TRIGGERS) {
    await knex.raw(`CREATE TRIGGER ${trigger.name} AFTER ${trigger.event} ON ${trigger.table} FOR EACH ROW ${trigger.body}`)
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const trigger of TRIGGERS) await knex.raw(`DROP TRIGGER IF EXISTS ${trigger.name}`)
  await knex.schema.alterTable('sites', (t) => {
    t.dropColumn('calendar_version')
  })
}
