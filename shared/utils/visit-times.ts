// Pure helpers for drawing visits on a site's local clock (My day, week views): a visit placed on a
// week grid, countdown text (the numbing clock itself is shared/domain/numbing-clock.ts). No Vue, no fetching; the local date
// and time arithmetic itself is in local-date.ts.
import type { BoardVisitDto } from '../types/visits'
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
