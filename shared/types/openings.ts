// Openings: the search for free times that fit a visit plan, across sites.
// The engine is shared/domain/openings.ts. All instants are UTC epoch milliseconds; intervals are
// half-open [startMs, endMs). Local wall time only matters for the booking grid and part of day.
import type { BookingUnitMinutes, OperatoryCapability, PlanSegment, TemplateCategory } from './chair-time'
import type { AvailabilityMs } from './rota'

/** morning = starts before 12:00 local; afternoon = starts at 12:00 local or later. */
export type PartOfDay = 'morning' | 'afternoon' | 'any'

/** The part of a VisitPlan the search needs; a whole VisitPlan fits. */
export interface OpeningsPlan {
  /** Contiguous from minute 0 to chairMinutes (planVisit's timeline). */
  segments: readonly Pick<PlanSegment, 'kind' | 'startMinute' | 'endMinute'>[]
  chairMinutes: number
}

export interface OpeningsOperatory {
  id: number
  siteId: number
  active: boolean
  /** OPERATORY_CAPABILITIES values; strings so database rows pass straight through. */
  capabilities: readonly string[]
}

export interface OpeningsProvider {
  id: number
  /** TEMPLATE_CATEGORIES values the provider performs, such as 'restorative' or 'hygiene'. */
  categories: readonly string[]
}

export interface OpeningsSite {
  id: number
  /** IANA zone name, e.g. 'America/Denver'. */
  timeZone: string
  bookingUnitMinutes: BookingUnitMinutes
  operatories: readonly OpeningsOperatory[]
  /** Providers who may work here; their time here comes from `availability.providers`. */
  providers: readonly OpeningsProvider[]
  /**
   * From expandAvailabilityMs for this site, covering at least the search range plus one visit:
   * chair time is opening hours minus blocks; provider time is shifts minus time off and blocks.
   */
  availability: AvailabilityMs
}

/** One segment of another, already booked visit. */
export interface BusySegment {
  operatoryId: number
  providerId: number | null
  kind: PlanSegment['kind']
  startMs: number
  endMs: number
}

export interface OpeningsQuery {
  plan: OpeningsPlan
  /** The template's capability: the operatory must have it. */
  capability: OperatoryCapability
  /** The template's category: the provider must perform it. */
  category: TemplateCategory
  sites: readonly OpeningsSite[]
  /** Segments of every other visit that may touch the range (any site). */
  busy: readonly BusySegment[]
  /** Starts are searched in [fromMs, toMs). */
  fromMs: number
  toMs: number
  nowMs: number
  /** The earliest start is nowMs + minimumNoticeMinutes. */
  minimumNoticeMinutes: number
  /** Filters: only this provider / this operatory. */
  providerId?: number
  operatoryId?: number
  /** Ranking among equally early starts. */
  preferredProviderId?: number
  preferredSiteId?: number
  /** A filter on the local start time (see PartOfDay). Default 'any'. */
  partOfDay?: PartOfDay
  /** How many openings to return. Default 10. */
  limit?: number
  /** Rank starts that sit against other visits in the same chair first (see openings.ts). */
  fewestGaps?: boolean
}

export interface Opening {
  siteId: number
  operatoryId: number
  providerId: number
  startMs: number
  /** startMs + chair minutes. */
  endMs: number
}

export type PartialFitProblem = 'provider_busy' | 'provider_off_shift' | 'chair_busy'

/** A start that fails exactly one rule: near misses to show when nothing fits. */
export interface PartialFit {
  siteId: number
  operatoryId: number
  providerId: number
  startMs: number
  endMs: number
  problem: PartialFitProblem
  /** Front-desk words, e.g. "The chair is free but the provider is with another patient". */
  note: string
}

export interface OpeningsResult {
  openings: Opening[]
  /** Only when nothing fits: why, in front-desk words. */
  reasons?: string[]
  /** Only when nothing fits: up to 3 nearest partial fits, earliest first. */
  nearest?: PartialFit[]
}

/** An opening's times for people and APIs. */
export interface FormattedOpeningTimes {
  /** ISO instant ending in 'Z'. */
  startUtc: string
  endUtc: string
  /** ISO local date-time with the site's offset, e.g. '2026-03-09T08:00:00-07:00'. */
  startLocalIso: string
  endLocalIso: string
  timeZone: string
}
