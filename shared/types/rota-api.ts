// Rota records and views as the API returns them. Dates and times are site-local wall values;
// every computed instant also comes in UTC.
import type { LocalDate, LocalTime, ShiftExceptionInput } from './rota'

export interface ShiftDto {
  id: number
  providerId: number
  siteId: number
  rrule: string
  /** The rule in plain words, e.g. "every Monday and Wednesday". */
  ruleText: string
  validFrom: LocalDate
  validUntil: LocalDate | null
  localStart: LocalTime
  localEnd: LocalTime
  note: string
}

/** As the rota expansion takes it, with the reason always present. */
export interface ShiftExceptionDto extends ShiftExceptionInput {
  reason: string
}

export interface BlockDto {
  id: number
  siteId: number
  operatoryId: number | null
  providerId: number | null
  startDate: LocalDate
  localStart: LocalTime
  localEnd: LocalTime
  rrule: string | null
  ruleText: string | null
  untilDate: LocalDate | null
  reason: string
}

/** An interval in both forms: UTC ('…Z') and the site's wall clock with its offset ('…-08:00'). */
export interface DualInterval {
  startUtc: string
  endUtc: string
  startLocalIso: string
  endLocalIso: string
}

export interface AvailabilityResponse {
  siteId: number
  timeZone: string
  fromUtc: string
  toUtc: string
  operatories: { operatoryId: number; intervals: DualInterval[] }[]
  providers: { providerId: number; siteId: number; intervals: DualInterval[] }[]
  blocks: ({ blockId: number; operatoryId: number | null; providerId: number | null; reason: string } & DualInterval)[]
}

export type RotaEntryKind = 'shift' | 'extra' | 'time_off' | 'block'

/** One thing on the Rota week grid, on one local date of its site. */
export interface RotaEntry {
  kind: RotaEntryKind
  /** The shift, exception or block it comes from. */
  sourceId: number
  siteId: number | null
  providerId: number | null
  operatoryId: number | null
  date: LocalDate
  /** Null for a whole-day time off. */
  localStart: LocalTime | null
  localEnd: LocalTime | null
  startUtc: string
  endUtc: string
  label: string
}

export interface RotaView {
  from: LocalDate
  to: LocalDate
  entries: RotaEntry[]
  shifts: ShiftDto[]
  exceptions: ShiftExceptionDto[]
  blocks: BlockDto[]
}
