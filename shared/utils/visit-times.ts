// Pure helpers for drawing visits on a site's local clock (My day, week views): a visit placed on a
// week grid, a visit's segments as bands over its length, countdown text (the numbing clock itself is shared/domain/numbing-clock.ts). No Vue, no fetching; the local date
// and time arithmetic itself is in local-date.ts.
import type { BoardVisitDto, SegmentDto } from '../types/visits'
import type { StepKind } from '../types/chair-time'
import { localDateAt, minutesIntoDay } from './local-date'

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

/** What each step kind means, as a band's or a bar's title says it. */
export const STEP_KIND_WORDS: Record<StepKind, string> = {
  hands_on: 'provider at the chair',
  assist: 'assistant only',
  numbing: 'numbing wait, provider free',
  reset: 'room reset',
}

/** One segment of a visit as a band: where it starts and how long it is, in percent of the visit's length. */
export interface SegmentBand {
  kind: StepKind
  offsetPercent: number
  sizePercent: number
  title: string
}

/**
 * A visit's segments as bands over its own length, in time order (the visit card's bands and the
 * panel's strip draw the same geometry). A segment is cut to the visit's span, so a band never draws
 * outside the card.
 */
export function segmentBands(segments: readonly SegmentDto[], startUtc: string, endUtc: string): SegmentBand[] {
  const start = Date.parse(startUtc)
  const length = Math.max(1, Date.parse(endUtc) - start)
  return [...segments]
    .sort((a, b) => Date.parse(a.startUtc) - Date.parse(b.startUtc))
    .map((segment) => {
      const from = Math.max(0, Date.parse(segment.startUtc) - start)
      const to = Math.min(length, Date.parse(segment.endUtc) - start)
      const size = Math.max(0, to - from)
      return {
        kind: segment.kind,
        offsetPercent: (from / length) * 100,
        sizePercent: (size / length) * 100,
        title: `${segment.label}: ${Math.round(size / 60000)} min (${STEP_KIND_WORDS[segment.kind]})`,
      }
    })
}

