// What the Rota week grid draws: every shift, extra day, time off and block occurrence on each
// local date of a window, with its wall times and its UTC instants. Pure; no availability
// arithmetic (that is rota.ts): a shift stays one entry even when lunch cuts it.

import type { RotaEntry } from '../types/rota-api'
import type { BlockInput, LocalDate, ShiftExceptionInput, ShiftInput, SiteCalendar } from '../types/rota'
import { toUtcInterval } from './intervals'
import { eachLocalDate, isoWeekdayOf, wallMidnightMs, wallToUtcMs, DAY_MS } from '../utils/local-date'
import { occurrenceDates } from './recurrence/occurrences'
import { localRangeToEpoch } from './rota'

export interface RotaWeekInput {
  sites: readonly SiteCalendar[]
  shifts: readonly ShiftInput[]
  exceptions: readonly ShiftExceptionInput[]
  blocks: readonly BlockInput[]
  /** Local dates, both inclusive, read in each site's own zone. */
  fromDate: LocalDate
  toDate: LocalDate
  /** Labels for providers and blocks, e.g. the provider's name. */
  providerName: (providerId: number) => string
}

function timed(date: LocalDate, start: string, end: string, zone: string) {
  return toUtcInterval(localRangeToEpoch(date, start, end, zone))
}

function wholeDay(date: LocalDate, zone: string) {
  const midnight = wallMidnightMs(date)
  return toUtcInterval({ startMs: wallToUtcMs(midnight, zone), endMs: wallToUtcMs(midnight + DAY_MS, zone) })
}

function shiftEntries(shift: ShiftInput, site: SiteCalendar, input: RotaWeekInput): RotaEntry[] {
  const closed = new Set(site.closedDates)
  return occurrenceDates(shift.rrule, shift.startDate, shift.untilDate, input.fromDate, input.toDate)
    .filter((date) => !closed.has(date))
    .map((date) => ({
      kind: 'shift', sourceId: shift.id, siteId: shift.siteId, providerId: shift.providerId, operatoryId: null, date,
      localStart: shift.localStart, localEnd: shift.localEnd, label: input.providerName(shift.providerId),
      ...timed(date, shift.localStart, shift.localEnd, site.timeZone),
    }))
}

function exceptionDates(exception: ShiftExceptionInput, input: RotaWeekInput): LocalDate[] {
  const first = exception.startDate > input.fromDate ? exception.startDate : input.fromDate
  const last = exception.endDate < input.toDate ? exception.endDate : input.toDate
  return first > last ? [] : eachLocalDate(first, last)
}

function exceptionEntries(exception: ShiftExceptionInput, site: SiteCalendar | null, input: RotaWeekInput): RotaEntry[] {
  const zone = site?.timeZone ?? 'UTC'
  const who = input.providerName(exception.providerId)
  const label = exception.kind === 'time_off' ? `${who}: time off${exception.reason ? ` (${exception.reason})` : ''}` : `${who} (extra)`
  return exceptionDates(exception, input).flatMap((date): RotaEntry[] => {
    const base = { kind: exception.kind, sourceId: exception.id, siteId: exception.siteId, providerId: exception.providerId, operatoryId: null, date, label }
    if (exception.localStart !== null && exception.localEnd !== null) {
      return [{ ...base, localStart: exception.localStart, localEnd: exception.localEnd, ...timed(date, exception.localStart, exception.localEnd, zone) }]
    }
    if (exception.kind === 'time_off' || !site) return [{ ...base, localStart: null, localEnd: null, ...wholeDay(date, zone) }]
    // An extra day without hours follows the site's opening hours, as the availability does.
    const hours = site.openingHours[String(isoWeekdayOf(date)) as keyof SiteCalendar['openingHours']] ?? []
    return hours.map((range) => ({ ...base, localStart: range.start, localEnd: range.end, ...timed(date, range.start, range.end, zone) }))
  })
}

function blockEntries(block: BlockInput, site: SiteCalendar, input: RotaWeekInput): RotaEntry[] {
  const dates = block.rrule === null
    ? (block.date >= input.fromDate && block.date <= input.toDate ? [block.date] : [])
    : occurrenceDates(block.rrule, block.date, block.untilDate, input.fromDate, input.toDate)
  return dates.map((date) => ({
    kind: 'block', sourceId: block.id, siteId: block.siteId, providerId: block.providerId, operatoryId: block.operatoryId, date,
    localStart: block.localStart, localEnd: block.localEnd, label: block.reason,
    ...timed(date, block.localStart, block.localEnd, site.timeZone),
  }))
}

const KIND_ORDER: Record<RotaEntry['kind'], number> = { block: 0, time_off: 1, shift: 2, extra: 3 }

/** Entries sorted by date, then start time, then kind. */
export function rotaEntries(input: RotaWeekInput): RotaEntry[] {
  const siteById = new Map(input.sites.map((site) => [site.id, site]))
  const entries: RotaEntry[] = []
  for (const shift of input.shifts) {
    const site = siteById.get(shift.siteId)
    if (site) entries.push(...shiftEntries(shift, site, input))
  }
  for (const exception of input.exceptions) {
    const site = exception.siteId === null ? null : siteById.get(exception.siteId) ?? null
    if (exception.siteId !== null && !site) continue
    entries.push(...exceptionEntries(exception, site, input))
  }
  for (const block of input.blocks) {
    const site = siteById.get(block.siteId)
    if (site) entries.push(...blockEntries(block, site, input))
  }
  return entries.sort((a, b) =>
    a.date.localeCompare(b.date) || (a.localStart ?? '').localeCompare(b.localStart ?? '') || KIND_ORDER[a.kind] - KIND_ORDER[b.kind] || a.sourceId - b.sourceId)
}
