// The booking grid of a site in LOCAL wall time, walked in UTC.
//
// A start is on the grid when its local minute of day is a multiple of the site's booking unit
// (5, 10 or 15 minutes, all dividing a day). We step through UTC instants and read each one's
// local time, never the other way round: local times that do not exist (spring forward) are then
// never produced, and the hour that happens twice (fall back) is offered twice, once per offset.
import type { PartOfDay } from '../types/openings'
import { DAY_MS, firstOffsetChange, offsetMinutesAt } from '../utils/local-date'

const MINUTE_MS = 60_000
const NOON_MINUTE = 12 * 60

function positiveModulo(value: number, divisor: number): number {
  return ((value % divisor) + divisor) % divisor
}

/** The first instant ≥ t whose wall time, read with `offsetMinutes`, is a multiple of unitMs. */
function alignUp(t: number, offsetMinutes: number, unitMs: number): number {
  const remainder = positiveModulo(t + offsetMinutes * MINUTE_MS, unitMs)
  return remainder === 0 ? t : t + (unitMs - remainder)
}

/**
 * The earliest grid start at or after `t`. Within one offset the grid is a plain UTC stride; when
 * the offset changes before the next aligned instant, we restart from the change with the new
 * offset (at most once per call in practice: offsets never change twice within 15 minutes).
 */
export function nextGridStart(t: number, zone: string, unitMinutes: number): number {
  const unitMs = unitMinutes * MINUTE_MS
  let from = t
  for (;;) {
    const offset = offsetMinutesAt(zone, from)
    const candidate = alignUp(from, offset, unitMs)
    if (candidate === from || offsetMinutesAt(zone, candidate) === offset) return candidate
    from = firstOffsetChange(zone, from, candidate)
  }
}

/** Minutes since local midnight at a UTC instant. */
export function localMinuteOfDay(t: number, zone: string): number {
  return Math.floor(positiveModulo(t + offsetMinutesAt(zone, t) * MINUTE_MS, DAY_MS) / MINUTE_MS)
}

/** morning: local start before 12:00; afternoon: 12:00 or later. */
export function isInPartOfDay(t: number, zone: string, part: PartOfDay): boolean {
  if (part === 'any') return true
  const isMorning = localMinuteOfDay(t, zone) < NOON_MINUTE
  return part === 'morning' ? isMorning : !isMorning
}
