// The bounds every request is held to, so that no caller can make the server expand a rota to the
// year 9999 or look up an id MariaDB cannot hold. Pure: used by the zod schemas in shared/schemas/.

/**
 * Dates and instants a caller may send: from DATE_BOUNDS.earliest to today (UTC) plus
 * DATE_BOUNDS.yearsAhead years. One constant for every route, so every 400 reads the same.
 */
export const DATE_BOUNDS = { earliest: '2000-01-01', yearsAhead: 3 } as const

/** The longest window (inclusive days) a range route works over; Balance has its own, shorter one. */
export const MAX_WINDOW_DAYS = 93

/** Ids are MariaDB INT UNSIGNED AUTO_INCREMENT columns used as signed 32-bit numbers: 1 … 2^31 − 1. */
export const MAX_ID = 2_147_483_647

const DAY_MS = 86_400_000

/**
 * The longest visit, in chair minutes (8 hours, a working day): planVisit refuses a longer plan, a
 * length set by hand may not exceed it, and a template whose steps alone add up to more is refused.
 * Every segment lies inside its visit, so nothing booked starts more than this before it ends. Overlap
 * reads use that as a lower bound (`start_utc > from − MAX_VISIT_MINUTES`, see earliestOverlappingStart),
 * so they scan a window of the (chair | provider | patient, start_utc) indexes, not each chair's history.
 */
export const MAX_VISIT_MINUTES = 480

/**
 * The lower bound an overlap read adds to `start_utc < :to AND end_utc > :from`: a visit or segment
 * overlapping [fromMs, …) started after fromMs − MAX_VISIT_MINUTES (it lasts at most that long).
 */
export function earliestOverlappingStart(fromMs: number): Date {
  return new Date(fromMs - MAX_VISIT_MINUTES * 60_000)
}


/** The last date (YYYY-MM-DD) a caller may send: today in UTC plus DATE_BOUNDS.yearsAhead years. */
export function latestAllowedDate(now: Date = new Date()): string {
  const latest = new Date(Date.UTC(now.getUTCFullYear() + DATE_BOUNDS.yearsAhead, now.getUTCMonth(), now.getUTCDate()))
  return latest.toISOString().slice(0, 10)
}

/** Why a YYYY-MM-DD date is out of bounds, or null when it is inside them (or not a date at all). */
export function dateBoundsProblem(date: string, now: Date = new Date()): string | null {
  if (!/^\d{4}-\d{2}-\d{2}$/.test(date)) return null
  const latest = latestAllowedDate(now)
  if (date < DATE_BOUNDS.earliest || date > latest) return `must be between ${DATE_BOUNDS.earliest} and ${latest}`
  return null
}

/** The same for an instant (any ISO date-time): its UTC date must lie inside the bounds. */
export function instantBoundsProblem(instant: string, now: Date = new Date()): string | null {
  const ms = Date.parse(instant)
  if (Number.isNaN(ms)) return null
  const latest = latestAllowedDate(now)
  if (ms < Date.parse(`${DATE_BOUNDS.earliest}T00:00:00Z`) || ms >= Date.parse(`${latest}T00:00:00Z`) + DAY_MS) {
    return `must be between ${DATE_BOUNDS.earliest} and ${latest}`
  }
  return null
}

/** Inclusive days from one YYYY-MM-DD date to another (1 when they are the same day). */
export function inclusiveDays(from: string, to: string): number {
  return Math.round((Date.parse(`${to.slice(0, 10)}T00:00:00Z`) - Date.parse(`${from.slice(0, 10)}T00:00:00Z`)) / DAY_MS) + 1
}

/**
 * Characters that never belong in a name, an e-mail address, a reason or a note: C0 controls
 * (line breaks and tabs included), DEL and the C1 controls, plus the Unicode line and paragraph
 * separators. They would break e-mail headers, calendar lines and printed lists.
 */
// eslint-disable-next-line no-control-regex -- matching control characters is this pattern's whole job
export const CONTROL_CHARACTERS = /[\u0000-\u001f\u007f-\u009f\u2028\u2029]/
