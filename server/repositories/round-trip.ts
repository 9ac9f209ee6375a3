// Several statements sent to MariaDB as one message (mysql2's multipleStatements, db/connection.ts),
// so a transaction's fixed steps cost one network round trip instead of one each (issue 19 §3: the
// booking's CPU went mostly into sending statements one by one). Each statement is still built by
// Knex with its values bound, never spliced into the text; they run in order on the caller's
// connection, inside the caller's transaction, and the first that fails stops the rest and throws
// as if it had been sent alone.
import type { Knex } from 'knex'
import type { Db } from '../utils/db'

type Sendable = Knex.QueryBuilder | Knex.Raw

/** One or more SQL statements and how to read their answers (rows for a read, mysql2's ResultSetHeader for a write). */
export interface Statement<T> {
  queries: readonly Sendable[]
  read: (answers: readonly unknown[]) => T | Promise<T>
}

/** One SQL statement and how to read its answer. */
export function statement<T>(query: Sendable, read: (answer: unknown) => T | Promise<T>): Statement<T> {
  return { queries: [query], read: (answers) => read(answers[0]) }
}

/** A write whose answer nobody needs. */
export function writeOnly(query: Sendable): Statement<void> {
  return statement(query, () => undefined)
}

/** Several statements of one kind as one, their answers in order. */
export function allOf<T>(statements: readonly Statement<T>[]): Statement<T[]> {
  return {
    queries: statements.flatMap((one) => one.queries),
    read: (answers) => Promise.all(splitAnswers(statements, answers)) as Promise<T[]>,
  }
}

/** The rows a read answered. */
export function rowsOf<Row>(answer: unknown): Row[] {
  return answer as Row[]
}

/** What an INSERT answered: the first new row's id. */
export function insertIdOf(answer: unknown): number {
  return (answer as { insertId: number }).insertId
}

function splitAnswers<T>(statements: readonly Statement<T>[], answers: readonly unknown[]): Array<T | Promise<T>> {
  let at = 0
  return statements.map((one) => {
    const mine = answers.slice(at, at + one.queries.length)
    at += one.queries.length
    return one.read(mine)
  })
}

type Answers<T extends readonly unknown[]> = { [K in keyof T]: Statement<T[K]> }

/** How mysql2 hands back rows: as arrays of cells in the selected order (cheaper for bulk reads), or as objects by column name. */
export interface TripOptions { rowsAsArray?: boolean }

/** Runs the statements in order in one round trip and reads each one's answer. */
export async function inOneTrip<T extends readonly unknown[]>(db: Db, statements: Answers<T>, options: TripOptions = {}): Promise<T> {
  const list = statements as readonly Statement<unknown>[]
  const sent = list.flatMap((one) => one.queries).map((query) => query.toSQL().toNative())
  if (!sent.length) return Promise.all(splitAnswers(list, [])) as Promise<unknown> as Promise<T>
  const [answer] = await db.raw(sent.map((part) => part.sql).join(';\n'), sent.flatMap((part) => part.bindings)).options(options) as [unknown]
  // mysql2 answers one statement with its answer, several with a list of answers.
  const answers = sent.length === 1 ? [answer] : answer as unknown[]
  return Promise.all(splitAnswers(list, answers)) as Promise<unknown> as Promise<T>
}
