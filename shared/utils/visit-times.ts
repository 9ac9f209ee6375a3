// Pure helpers for drawing visits on a site's local clock (My day, week views): a visit placed on a
// week grid, the numbing segment running now, countdown text. No Vue, no fetching; the local date
// and time arithmetic itself is in local-date.ts.
import type { BoardVisitDto, SegmentDto } from '../types/visits'
import { isClosed } from '../domain/visit-states'
import { localDateAt, minutesIntoDay } from './local-date'

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
  const date = localDateAt(Date.parse(visit.startUtc), timeZone)
  return {
    visit, date, timeZone, ...extra,
    startMinutes: minutesIntoDay(visit.startUtc, timeZone, date),
    endMinutes: minutesIntoDay(visit.endUtc, timeZone, date),
  }
}
