// Pure helpers for drawing visits on a site's local clock (My day, week views): local day windows,
// minutes into a day, the numbing segment running now, countdown text. No Vue, no fetching.
import { DateTime } from 'luxon'
import type { BoardVisitDto, SegmentDto } from '#shared/types/appointments'
import { isClosed } from '#shared/domain/visit-states'

/** A UTC range [fromUtc, toUtc) of ISO instants, as GET /api/appointments takes it. */
export interface UtcRange {
  fromUtc: string
  toUtc: string
}

/** One local date of a zone as the UTC range the API takes. */
export function localDayRange(date: string, zone: string): UtcRange {
  const start = DateTime.fromISO(date, { zone }).startOf('day')
  return { fromUtc: start.toUTC().toISO()!, toUtc: start.plus({ days: 1 }).toUTC().toISO()! }
}

/** Local dates from..to (inclusive) in every zone at once: a UTC range wide enough for each of them. */
export function anyZoneRange(fromDate: string, toDate: string): UtcRange {
  const from = DateTime.fromISO(fromDate, { zone: 'UTC' }).minus({ days: 1 })
  const to = DateTime.fromISO(toDate, { zone: 'UTC' }).plus({ days: 2 })
  return { fromUtc: from.toISO()!, toUtc: to.toISO()! }
}

export function localDateOf(utc: string, zone: string): string {
  return DateTime.fromISO(utc, { zone: 'UTC' }).setZone(zone).toISODate()!
}

/** Minutes since local midnight of `date` (may be negative or past 1440 for visits across midnight). */
export function minutesIntoDay(utc: string, zone: string, date: string): number {
  const midnight = DateTime.fromISO(date, { zone }).startOf('day')
  return Math.round(DateTime.fromISO(utc, { zone: 'UTC' }).diff(midnight, 'minutes').minutes)
}

export function localTime(utc: string, zone: string): string {
  return DateTime.fromISO(utc, { zone: 'UTC' }).setZone(zone).toFormat('HH:mm')
}

/** Visible hours of a day: 07:00–18:00 at least, widened to whatever the visits need. */
export function visibleHours(spans: readonly { startMinutes: number; endMinutes: number }[]): { first: number; last: number } {
  let first = 7
  let last = 18
  for (const span of spans) {
    first = Math.min(first, Math.max(0, Math.floor(span.startMinutes / 60)))
    last = Math.max(last, Math.min(24, Math.ceil(span.endMinutes / 60)))
  }
  return { first, last }
}

/** The numbing segment a visit is in at `nowMs`, if any: the patient is ready at its end. */
export function numbingSegmentAt(segments: readonly SegmentDto[], nowMs: number): SegmentDto | null {
  return segments.find((segment) => segment.kind === 'numbing'
    && Date.parse(segment.startUtc) <= nowMs && nowMs < Date.parse(segment.endUtc)) ?? null
}

/** Milliseconds until the patient is ready, or null when the visit is not numbing at `nowMs`. */
export function msUntilReady(visit: Pick<BoardVisitDto, 'segments' | 'state'>, nowMs: number): number | null {
  if (isClosed(visit.state)) return null
  const segment = numbingSegmentAt(visit.segments, nowMs)
  return segment ? Date.parse(segment.endUtc) - nowMs : null
}

/** 372 500 ms → "6:13" (whole seconds rounded up, so it reads 0:01 until the moment it is ready). */
export function countdownText(ms: number): string {
  const seconds = Math.max(0, Math.ceil(ms / 1000))
  const hours = Math.floor(seconds / 3600)
  const minutes = Math.floor((seconds % 3600) / 60)
  const rest = String(seconds % 60).padStart(2, '0')
  return hours > 0 ? `${hours}:${String(minutes).padStart(2, '0')}:${rest}` : `${minutes}:${rest}`
}

export interface Lane<T> {
  item: T
  lane: number
  lanes: number
}

/** Side-by-side lanes for overlapping spans (greedy); every overlapping group shares one lane count. */
export function laneSpans<T extends { startMinutes: number; endMinutes: number }>(spans: readonly T[]): Lane<T>[] {
  const sorted = [...spans].sort((a, b) => a.startMinutes - b.startMinutes || b.endMinutes - a.endMinutes)
  const placed: Lane<T>[] = []
  let group: Lane<T>[] = []
  let groupEnd = -Infinity
  let laneEnds: number[] = []
  const close = () => {
    const lanes = Math.max(1, ...group.map((entry) => entry.lane + 1))
    for (const entry of group) entry.lanes = lanes
    group = []
    laneEnds = []
  }
  for (const item of sorted) {
    if (item.startMinutes >= groupEnd && group.length) close()
    let lane = laneEnds.findIndex((end) => end <= item.startMinutes)
    if (lane < 0) lane = laneEnds.length
    laneEnds[lane] = item.endMinutes
    const entry = { item, lane, lanes: 1 }
    group.push(entry)
    placed.push(entry)
    groupEnd = Math.max(groupEnd, item.endMinutes)
  }
  if (group.length) close()
  return placed
}

/** A visit placed on a week grid: its local date and minutes into that date in its site's zone. */
export interface WeekGridVisit {
  visit: BoardVisitDto
  date: string
  startMinutes: number
  endMinutes: number
  timeZone: string
  caption?: string
  colour?: string
}

export function placeOnWeek(visit: BoardVisitDto, timeZone: string, extra: { caption?: string; colour?: string } = {}): WeekGridVisit {
  const date = localDateOf(visit.startUtc, timeZone)
  return {
    visit, date, timeZone, ...extra,
    startMinutes: minutesIntoDay(visit.startUtc, timeZone, date),
    endMinutes: minutesIntoDay(visit.endUtc, timeZone, date),
  }
}

/** The seven local dates of the week starting `monday`, labelled, with today marked. */
export function weekDays(monday: string, today: string): { date: string; label: string; today: boolean }[] {
  const start = DateTime.fromISO(monday, { zone: 'UTC' })
  return Array.from({ length: 7 }, (_, index) => {
    const day = start.plus({ days: index })
    const date = day.toISODate()!
    return { date, label: day.toFormat('ccc d LLL'), today: date === today }
  })
}

export function weekLabelOf(monday: string): string {
  const start = DateTime.fromISO(monday, { zone: 'UTC' })
  return `${start.toFormat('d LLL')} – ${start.plus({ days: 6 }).toFormat('d LLL yyyy')}`
}
