// Availability for one site over a UTC window: when each chair is open and when each
// provider is on shift there, with blocks applied. Pure; all results in UTC.
//
// Rules (decisions, so the openings search can rely on them):
// - Operatory time = the site's opening hours on dates that are not closed, minus site-wide
//   blocks and that operatory's blocks. Inactive operatories (and other sites' ones) are omitted.
// - Provider time = shift occurrences at this site plus 'extra' exceptions at this site, minus
//   time off, that provider's blocks and site-wide blocks. It is NOT clipped to opening hours:
//   a provider who starts before the doors open is still working (paperwork, set-up); the openings
//   search intersects provider time with chair time anyway. Closed dates DO remove regular shift
//   occurrences (nobody works a holiday by rule), but an 'extra' on a closed date stays: it was
//   planned on purpose. Providers with no time in the window are omitted.
// - Exception windows (localStart–localEnd) apply on every date from startDate to endDate.
// - A block holding both an operatory and a provider applies to both.
// - Everything is clipped to [fromUtc, toUtc), merged and sorted. Block occurrences are clipped too.
// - Local times follow recurrence.ts (RFC 5545 §3.3.5 for DST gaps and repeats). An end at or
//   before the start runs past midnight into the next local date.

import type {
  Availability,
  AvailabilityMs,
  BlockInput,
  BlockOccurrenceMs,
  EpochInterval,
  ExpandAvailabilityInput,
  LocalDate,
  LocalTime,
  OperatoryAvailability,
  ProviderAvailability,
  ShiftClash,
  ShiftExceptionInput,
  ShiftInput,
  SiteCalendar,
} from '../types/rota'
import { clipIntervals, mergeIntervals, parseUtcInstant, subtractIntervals, toUtcInterval } from './intervals'
import {
  addDays,
  DAY_MS,
  eachLocalDate,
  isoWeekdayOf,
  localDateAt,
  minutesOfDay,
  wallMidnightMs,
  wallToUtcMs,
} from '../utils/local-date'
import { occurrenceDates } from './recurrence/occurrences'

const MINUTE_MS = 60_000

/** The UTC interval of a local time range on one local date; an end ≤ start ends the next day. */
export function localRangeToEpoch(date: LocalDate, start: LocalTime, end: LocalTime, zone: string): EpochInterval {
  const midnight = wallMidnightMs(date)
  const startMinutes = minutesOfDay(start)
  let endMinutes = minutesOfDay(end)
  if (endMinutes <= startMinutes) endMinutes += 24 * 60
  return {
    startMs: wallToUtcMs(midnight + startMinutes * MINUTE_MS, zone),
    endMs: wallToUtcMs(midnight + endMinutes * MINUTE_MS, zone),
  }
}

/** The whole local day, midnight to midnight (23 or 25 hours on DST days). */
function wholeLocalDay(date: LocalDate, zone: string): EpochInterval {
  const midnight = wallMidnightMs(date)
  return { startMs: wallToUtcMs(midnight, zone), endMs: wallToUtcMs(midnight + DAY_MS, zone) }
}

/** Local dates that can touch [fromMs, toMs): a day of slack before for ranges running past midnight. */
interface LocalDateSpan {
  first: LocalDate
  last: LocalDate
}

function localDateSpan(fromMs: number, toMs: number, zone: string): LocalDateSpan {
  return { first: addDays(localDateAt(fromMs, zone), -1), last: localDateAt(toMs, zone) }
}

/**
 * Whether the site is closed on a local date: on its closed list, or a weekday without opening hours.
 * The one answer for availability below and for the Rota screen's greyed days.
 */
export function isSiteClosedOn(site: Pick<SiteCalendar, 'openingHours' | 'closedDates'>, date: LocalDate): boolean {
  if (site.closedDates.includes(date)) return true
  return (site.openingHours[String(isoWeekdayOf(date)) as keyof SiteCalendar['openingHours']] ?? []).length === 0
}

function openingIntervalsOn(site: SiteCalendar, date: LocalDate): EpochInterval[] {
  const ranges = site.openingHours[String(isoWeekdayOf(date)) as keyof SiteCalendar['openingHours']] ?? []
  return ranges.map((range) => localRangeToEpoch(date, range.start, range.end, site.timeZone))
}

/** The site's opening hours on one local date as UTC intervals; none on a closed date. */
export function siteOpeningOn(site: SiteCalendar, date: LocalDate): EpochInterval[] {
  return isSiteClosedOn(site, date) ? [] : openingIntervalsOn(site, date)
}

function openingIntervals(site: SiteCalendar, dates: readonly LocalDate[], closed: ReadonlySet<LocalDate>): EpochInterval[] {
  return dates.filter((date) => !closed.has(date)).flatMap((date) => openingIntervalsOn(site, date))
}

function ruleOrSingleDates(
  rrule: string | null,
  firstDate: LocalDate,
  untilDate: LocalDate | null,
  span: LocalDateSpan,
): LocalDate[] {
  if (rrule !== null) return occurrenceDates(rrule, firstDate, untilDate, span.first, span.last)
  return firstDate >= span.first && firstDate <= span.last ? [firstDate] : []
}

function blockOccurrences(block: BlockInput, span: LocalDateSpan, zone: string): BlockOccurrenceMs[] {
  return ruleOrSingleDates(block.rrule, block.date, block.untilDate, span).map((date) => ({
    blockId: block.id,
    operatoryId: block.operatoryId,
    providerId: block.providerId,
    reason: block.reason,
    ...localRangeToEpoch(date, block.localStart, block.localEnd, zone),
  }))
}

function shiftIntervals(shift: ShiftInput, span: LocalDateSpan, zone: string, closed: ReadonlySet<LocalDate>): EpochInterval[] {
  return occurrenceDates(shift.rrule, shift.startDate, shift.untilDate, span.first, span.last)
    .filter((date) => !closed.has(date))
    .map((date) => localRangeToEpoch(date, shift.localStart, shift.localEnd, zone))
}

function exceptionDatesInSpan(exception: ShiftExceptionInput, span: LocalDateSpan): LocalDate[] {
  const first = exception.startDate > span.first ? exception.startDate : span.first
  const last = exception.endDate < span.last ? exception.endDate : span.last
  return first > last ? [] : eachLocalDate(first, last)
}

function exceptionIntervals(exception: ShiftExceptionInput, span: LocalDateSpan, site: SiteCalendar): EpochInterval[] {
  return exceptionDatesInSpan(exception, span).flatMap((date) => {
    if (exception.localStart !== null && exception.localEnd !== null) {
      return [localRangeToEpoch(date, exception.localStart, exception.localEnd, site.timeZone)]
    }
    return exception.kind === 'time_off' ? [wholeLocalDay(date, site.timeZone)] : openingIntervalsOn(site, date)
  })
}

function appliesToSite(exception: ShiftExceptionInput, siteId: number): boolean {
  return exception.siteId === null ? exception.kind === 'time_off' : exception.siteId === siteId
}

function pushTo<K>(map: Map<K, EpochInterval[]>, key: K, interval: EpochInterval): void {
  const list = map.get(key)
  if (list) list.push(interval)
  else map.set(key, [interval])
}

interface BlockIndex {
  all: BlockOccurrenceMs[]
  siteWide: EpochInterval[]
  byOperatory: Map<number, EpochInterval[]>
  byProvider: Map<number, EpochInterval[]>
}

function indexBlocks(blocks: readonly BlockInput[], site: SiteCalendar, span: LocalDateSpan): BlockIndex {
  const index: BlockIndex = { all: [], siteWide: [], byOperatory: new Map(), byProvider: new Map() }
  for (const block of blocks) {
    if (block.siteId !== site.id) continue
    for (const occurrence of blockOccurrences(block, span, site.timeZone)) {
      index.all.push(occurrence)
      if (block.operatoryId !== null) pushTo(index.byOperatory, block.operatoryId, occurrence)
      if (block.providerId !== null) pushTo(index.byProvider, block.providerId, occurrence)
      if (block.operatoryId === null && block.providerId === null) index.siteWide.push(occurrence)
    }
  }
  return index
}

function clippedBlocks(all: readonly BlockOccurrenceMs[], fromMs: number, toMs: number): BlockOccurrenceMs[] {
  return all
    .filter((b) => b.startMs < toMs && b.endMs > fromMs)
    .map((b) => ({ ...b, startMs: Math.max(b.startMs, fromMs), endMs: Math.min(b.endMs, toMs) }))
    .sort((a, b) => a.startMs - b.startMs || a.blockId - b.blockId)
}

interface ProviderSources {
  worked: EpochInterval[]
  away: EpochInterval[]
}

function collectProviderSources(input: ExpandAvailabilityInput, span: LocalDateSpan, closed: ReadonlySet<LocalDate>): Map<number, ProviderSources> {
  const { site } = input
  const sources = new Map<number, ProviderSources>()
  const sourcesOf = (providerId: number): ProviderSources => {
    let entry = sources.get(providerId)
    if (!entry) {
      entry = { worked: [], away: [] }
      sources.set(providerId, entry)
    }
    return entry
  }
  for (const shift of input.shifts) {
    if (shift.siteId === site.id) sourcesOf(shift.providerId).worked.push(...shiftIntervals(shift, span, site.timeZone, closed))
  }
  for (const exception of input.exceptions) {
    if (!appliesToSite(exception, site.id)) continue
    if (exception.kind === 'extra') sourcesOf(exception.providerId).worked.push(...exceptionIntervals(exception, span, site))
    // Time off matters only for providers who work here; it never creates an entry.
    else sources.get(exception.providerId)?.away.push(...exceptionIntervals(exception, span, site))
  }
  return sources
}

/** Availability as epoch milliseconds: the fast form for the openings search. */
export function expandAvailabilityMs(input: ExpandAvailabilityInput): AvailabilityMs {
  const { site } = input
  const fromMs = parseUtcInstant(input.fromUtc)
  const toMs = parseUtcInstant(input.toUtc)
  if (toMs <= fromMs) return { operatories: [], providers: [], blocks: [] }
  const span = localDateSpan(fromMs, toMs, site.timeZone)
  const closed = new Set(site.closedDates)
  const open = mergeIntervals(openingIntervals(site, eachLocalDate(span.first, span.last), closed))
  const blocks = indexBlocks(input.blocks, site, span)
  const finish = (base: EpochInterval[], cuts: EpochInterval[]): EpochInterval[] =>
    clipIntervals(subtractIntervals(base, cuts), fromMs, toMs)

  const operatories: OperatoryAvailability<EpochInterval>[] = input.operatories
    .filter((operatory) => operatory.active && operatory.siteId === site.id)
    .sort((a, b) => a.id - b.id)
    .map((operatory) => ({
      operatoryId: operatory.id,
      intervals: finish(open, [...blocks.siteWide, ...(blocks.byOperatory.get(operatory.id) ?? [])]),
    }))

  const providers: ProviderAvailability<EpochInterval>[] = []
  const sources = collectProviderSources(input, span, closed)
  for (const providerId of [...sources.keys()].sort((a, b) => a - b)) {
    const { worked, away } = sources.get(providerId)!
    const intervals = finish(worked, [...away, ...blocks.siteWide, ...(blocks.byProvider.get(providerId) ?? [])])
    if (intervals.length > 0) providers.push({ providerId, siteId: site.id, intervals })
  }

  return { operatories, providers, blocks: clippedBlocks(blocks.all, fromMs, toMs) }
}

/** Availability with ISO UTC strings, for APIs and the UI. */
export function expandAvailability(input: ExpandAvailabilityInput): Availability {
  const result = expandAvailabilityMs(input)
  return {
    operatories: result.operatories.map((o) => ({ operatoryId: o.operatoryId, intervals: o.intervals.map(toUtcInterval) })),
    providers: result.providers.map((p) => ({ providerId: p.providerId, siteId: p.siteId, intervals: p.intervals.map(toUtcInterval) })),
    blocks: result.blocks.map(({ startMs, endMs, ...rest }) => ({ ...rest, ...toUtcInterval({ startMs, endMs }) })),
  }
}

// ---------------------------------------------------------------------------
// Shift clashes across sites
// ---------------------------------------------------------------------------

interface DatedInterval extends EpochInterval {
  date: LocalDate
}

function datedShiftIntervals(shift: ShiftInput, zone: string, firstDate: LocalDate, lastDate: LocalDate): DatedInterval[] {
  return occurrenceDates(shift.rrule, shift.startDate, shift.untilDate, firstDate, lastDate).map((date) => ({
    date,
    ...localRangeToEpoch(date, shift.localStart, shift.localEnd, zone),
  }))
}

/** The first of `mine` (sorted) that overlaps any of `theirs` (sorted), by a two-pointer sweep. */
function firstOverlap(mine: readonly DatedInterval[], theirs: readonly EpochInterval[]): DatedInterval | null {
  let j = 0
  for (const interval of mine) {
    while (j < theirs.length && theirs[j]!.endMs <= interval.startMs) j++
    if (j < theirs.length && theirs[j]!.startMs < interval.endMs) return interval
  }
  return null
}

/**
 * The first local date (in the candidate's site zone) on which `candidate` overlaps one of the
 * same provider's shifts at ANOTHER site, compared as UTC instants; null when none within
 * `horizonDays` from the candidate's start date. Shifts at the same site are not a clash here.
 */
export function findFirstShiftClash(
  candidate: ShiftInput,
  others: readonly ShiftInput[],
  zoneOfSite: (siteId: number) => string,
  horizonDays = 730,
): ShiftClash | null {
  const candidateZone = zoneOfSite(candidate.siteId)
  const horizonEnd = addDays(candidate.startDate, horizonDays - 1)
  const lastDate = candidate.untilDate !== null && candidate.untilDate < horizonEnd ? candidate.untilDate : horizonEnd
  const mine = datedShiftIntervals(candidate, candidateZone, candidate.startDate, lastDate)
  if (mine.length === 0) return null
  const windowStart = mine[0]!.startMs
  const windowEnd = mine[mine.length - 1]!.endMs

  let best: { interval: DatedInterval; other: ShiftInput } | null = null
  for (const other of others) {
    if (other.providerId !== candidate.providerId || other.siteId === candidate.siteId || other.id === candidate.id) continue
    const zone = zoneOfSite(other.siteId)
    // A day of slack each side covers any difference between the two zones and overnight shifts.
    const theirs = mergeIntervals(
      datedShiftIntervals(other, zone, addDays(localDateAt(windowStart, zone), -1), addDays(localDateAt(windowEnd, zone), 1)),
    )
    const clash = firstOverlap(mine, theirs)
    if (clash && (!best || clash.startMs < best.interval.startMs)) best = { interval: clash, other }
  }
  return best ? { date: best.interval.date, otherShiftId: best.other.id, otherSiteId: best.other.siteId } : null
}
