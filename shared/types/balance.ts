// What the Balance screen shows: per site, its chairs together, each chair and each provider.
import type { BalanceThresholds, DayUse, UseFigures } from '../domain/balance'
import type { OutcomeRates } from '../domain/visit-outcomes'
import type { RefillFigures } from '../domain/balance-refill'
import type { SuggestionKind } from '../domain/balance-suggestions'
import type { RecallKind } from '../domain/recall'
import type { Channel } from '../domain/sms-channels'
import type { ChairTimeRequest } from '../schemas/templates'

export interface NamedUse extends UseFigures {
  id: number
  name: string
}

export interface SiteBalanceDto {
  siteId: number
  siteName: string
  timeZone: string
  chairs: UseFigures
  /** All chairs together per local date of the range. */
  days: DayUse[]
  operatories: NamedUse[]
  providers: NamedUse[]
  /** How the site's visits in the range turned out: no-show and late-cancellation rates. */
  outcomes: OutcomeRates
  /** Of the chair time cancellations and no-shows freed, how much later bookings took, and how soon. */
  refill: RefillFigures
}

export interface BalanceResponse {
  from: string
  to: string
  /** Hours before the start within which a cancellation counts as late (LATE_CANCEL_HOURS). */
  lateCancelHours: number
  thresholds: BalanceThresholds
  sites: SiteBalanceDto[]
}

/** Free chair time a suggestion fills: which chair, when. */
export interface SuggestedGap {
  operatoryId: number
  operatoryName: string
  startUtc: string
  endUtc: string
}

interface SuggestionBase {
  /** Stable within one answer, for lists and test ids: `<kind>-<site>-<record>`. */
  id: string
  kind: SuggestionKind
  siteId: number
  /** The site-local date it is about. */
  date: string
}

/** An open waitlist entry whose plan fits quiet chair time (the waitlist's own matching). */
export interface WaitlistFitSuggestion extends SuggestionBase {
  kind: 'waitlist_fit'
  gap: SuggestedGap
  entryId: number
  patientId: number
  patientName: string
  planLabel: string
  items: ChairTimeRequest['items']
  providerId: number
  providerName: string
  /** The earliest start the entry can take in the gap. */
  startUtc: string
  canOffer: boolean
  /** How an offer would go (e-mail and/or text), as `WaitlistMatchDto`. */
  channels: Channel[]
  offered: boolean
}

/** An overdue recall, with the quiet chair time to offer it. */
export interface RecallFitSuggestion extends SuggestionBase {
  kind: 'recall_fit'
  gap: SuggestedGap
  recallId: number
  patientId: number
  patientName: string
  recallKind: RecallKind
  dueDate: string
  canMail: boolean
}

/** A provider who could spend a quiet day at a site whose chairs are tight: time off at one, an extra day at the other. */
export interface RotaMoveSuggestion extends SuggestionBase {
  kind: 'rota_move'
  providerId: number
  providerName: string
  fromSiteId: number
  fromSiteName: string
  fromShare: number
  toSiteId: number
  toSiteName: string
  toShare: number
  /** The provider's hours at the quiet site that day ('HH:mm'), for the extra day. */
  localStart: string
  localEnd: string
}

/** A visit that could slide to join two short free stretches of its chair; only with the patient's agreement. */
export interface ConsolidateSuggestion extends SuggestionBase {
  kind: 'consolidate'
  visitId: number
  patientName: string
  patientPhone: string | null
  patientEmail: string | null
  operatoryId: number
  operatoryName: string
  providerName: string
  startUtc: string
  newStartUtc: string
  stretchesMinutes: [number, number]
  joinedMinutes: number
}

export type BalanceSuggestion = WaitlistFitSuggestion | RecallFitSuggestion | RotaMoveSuggestion | ConsolidateSuggestion

export interface BalanceSuggestionsResponse {
  from: string
  to: string
  suggestions: BalanceSuggestion[]
}
