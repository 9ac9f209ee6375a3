// Rota types shared by client and server: sites' calendars, shifts, exceptions,
// blocks, and the availability computed from them.
//
// Conventions:
// - A `LocalDate` ('YYYY-MM-DD') and a `LocalTime` ('HH:mm') are wall-clock values
//   in the site's own IANA time zone. They never carry an offset.
// - Everything computed is returned in UTC. Public results use ISO strings with `Z`
//   (`UtcInterval`); the hot path (openings search) can use epoch milliseconds
//   (`EpochInterval`) to skip parsing.
// - Intervals are half-open: [start, end). Touching intervals do not overlap.

/** 'YYYY-MM-DD', a calendar date on the site's wall clock. */
export type LocalDate = string

/** 'HH:mm', 24-hour wall-clock time. '24:00' is accepted as an end time (midnight at the end of the day). */
export type LocalTime = string

/** ISO weekday as a string key: '1' = Monday … '7' = Sunday (ISO 8601). */
export type IsoWeekdayKey = '1' | '2' | '3' | '4' | '5' | '6' | '7'

/** ISO weekday as a number: 1 = Monday … 7 = Sunday (ISO 8601). */
export type IsoWeekday = 1 | 2 | 3 | 4 | 5 | 6 | 7

export interface LocalTimeRange {
  start: LocalTime
  end: LocalTime
}

/** Opening hours per ISO weekday; an empty list means closed that weekday. */
export type OpeningHours = Record<IsoWeekdayKey, LocalTimeRange[]>

export interface SiteCalendar {
  id: number
  /** IANA zone name, e.g. 'America/Denver'. */
  timeZone: string
  openingHours: OpeningHours
  /** Local dates on which the site is closed (holidays). */
  closedDates: LocalDate[]
}

export interface OperatoryInput {
  id: number
  siteId: number
  active: boolean
}

export interface ShiftInput {
  id: number
  providerId: number
  siteId: number
  /** RRULE value without DTSTART or UNTIL, e.g. 'FREQ=WEEKLY;BYDAY=MO,WE'. */
  rrule: string
  /** Local date used as DTSTART; the shift is valid from this date. */
  startDate: LocalDate
  /** Last local date the shift may occur on (inclusive); null = open-ended. */
  untilDate: LocalDate | null
  localStart: LocalTime
  /** An end at or before the start means the shift runs past midnight into the next date. */
  localEnd: LocalTime
}

export type ShiftExceptionKind = 'time_off' | 'extra'

export interface ShiftExceptionInput {
  id: number
  providerId: number
  kind: ShiftExceptionKind
  /**
   * Required for 'extra' (where the provider works). For 'time_off', null means
   * away from every site; a site id limits the time off to that site.
   */
  siteId: number | null
  /** First and last local dates (inclusive). */
  startDate: LocalDate
  endDate: LocalDate
  /**
   * A daily window applied on every date from startDate to endDate.
   * Both null: the whole day for 'time_off'; the site's opening hours for 'extra'.
   */
  localStart: LocalTime | null
  localEnd: LocalTime | null
  reason?: string
}

export interface BlockInput {
  id: number
  siteId: number
  /** Set: the block holds this chair. */
  operatoryId: number | null
  /** Set: the block holds this provider. Neither set: the whole site. Both set: both. */
  providerId: number | null
  /** First local date (DTSTART date for a recurring block). */
  date: LocalDate
  localStart: LocalTime
  localEnd: LocalTime
  /** RRULE value without DTSTART or UNTIL; null = a one-off block. */
  rrule: string | null
  untilDate: LocalDate | null
  reason: string
}

/** Half-open UTC interval as ISO 8601 strings ending in 'Z'. */
export interface UtcInterval {
  startUtc: string
  endUtc: string
}

/** Half-open UTC interval as epoch milliseconds; the fast form for searches. */
export interface EpochInterval {
  startMs: number
  endMs: number
}

export interface OperatoryAvailability<I = UtcInterval> {
  operatoryId: number
  intervals: I[]
}

export interface ProviderAvailability<I = UtcInterval> {
  providerId: number
  siteId: number
  intervals: I[]
}

export interface BlockOccurrence {
  blockId: number
  operatoryId: number | null
  providerId: number | null
  reason: string
  startUtc: string
  endUtc: string
}

export interface BlockOccurrenceMs {
  blockId: number
  operatoryId: number | null
  providerId: number | null
  reason: string
  startMs: number
  endMs: number
}

export interface Availability {
  operatories: OperatoryAvailability[]
  providers: ProviderAvailability[]
  blocks: BlockOccurrence[]
}

export interface AvailabilityMs {
  operatories: OperatoryAvailability<EpochInterval>[]
  providers: ProviderAvailability<EpochInterval>[]
  blocks: BlockOccurrenceMs[]
}

export interface ExpandAvailabilityInput {
  site: SiteCalendar
  operatories: OperatoryInput[]
  shifts: ShiftInput[]
  exceptions: ShiftExceptionInput[]
  blocks: BlockInput[]
  /** ISO instant; the window is [fromUtc, toUtc). */
  fromUtc: string
  toUtc: string
}

export interface ShiftClash {
  /** The candidate shift's local date on which it first clashes. */
  date: LocalDate
  otherShiftId: number
  otherSiteId: number
}
