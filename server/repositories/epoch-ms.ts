// A DATETIME column (a UTC instant, see db/connection.ts) read as epoch milliseconds, a plain
// number: bulk reads (Balance, openings) skip mysql2's Date parsing and the garbage of a Date per
// cell, which was a third of their CPU at group scale (issue 19 §3). DATETIME arithmetic is
// independent of the session's time zone.
import type { Knex } from 'knex'
import type { Db } from '../utils/db'

/** `column AS alias` as epoch milliseconds (a BIGINT, read by mysql2 as a number). */
export function epochMs(db: Db, column: string, alias: string): Knex.Raw {
  return db.raw("TIMESTAMPDIFF(MICROSECOND, '1970-01-01 00:00:00', ??) DIV 1000 AS ??", [column, alias])
}
