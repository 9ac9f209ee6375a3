// What the Balance screen shows: per site, its chairs together, each chair and each provider.
import type { BalanceThresholds, DayUse, UseFigures } from '../domain/balance'
import type { OutcomeRates } from '../domain/visit-outcomes'
import type { RefillFigures } from '../domain/balance-refill'
import type { SuggestionKind } from '../domain/balance-suggestions'
import type { RecallKind } from '../domain/recall'
import type { Channel } from '../domain/sms-channels'
import type { ChairTimeRequest } from '../schemas/templates'
import type { StrandedVisitDto } from './rebook'

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

/**
 * An overdue recall whose plan has a real opening in quiet chair time: the openings engine restricted to
 * the quiet chair's free window (chair capability, a provider on shift who does the procedure, the
 * whole length including any numbing wait).
 */
export interface RecallFitSuggestion extends SuggestionBase {
  kind: 'recall_fit'
  /** The quiet window the opening lies in. */
  gap: SuggestedGap
  recallId: number
  patientId: number
  patientName: string
  recallKind: RecallKind
  dueDate: string
  canMail: boolean
  /** The recall's plan (the recall page's: what the patient last had of that kind), as the drawer takes it. */
  items: Array<{ templateCode: string }>
  planLabel: string
  /** The opening: chair, provider and start; "Book in the drawer" opens exactly this. */
  operatoryId: number
  providerId: number
  providerName: string
  startUtc: string
  endUtc: string
  /** The chair time the plan holds, and the part of it that is a numbing wait (practice defaults). */
  chairMinutes: number
  numbingMinutes: number
}

/** A provider who could spend a quiet day at a site whose chairs are tight: moved in one step (POST /api/balance/rota-moves). */
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
  /** The provider's hours at the quiet site that day, on its clock ('HH:mm'). */
  localStart: string
  localEnd: string
  /** The same day at the tight site, on ITS clock (`receivingHours`: the same instants within its opening hours). */
  toLocalStart: string
  toLocalEnd: string
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

/** What a rota move does (POST /api/balance/rota-moves): whole-day time off at one site, an extra day at the other. */
export interface RotaMovePlan {
  providerId: number
  providerName: string
  /** The local date, the same at both sites. */
  date: string
  fromSiteId: number
  fromSiteName: string
  /** The provider's hours at the quiet site, on its clock. */
  fromLocalStart: string
  fromLocalEnd: string
  toSiteId: number
  toSiteName: string
  /** The extra day at the receiving site, on its own clock (`receivingHours`). */
  toLocalStart: string
  toLocalEnd: string
  startUtc: string
  endUtc: string
}

/** The preview (`dryRun`) writes nothing; the save (201) wrote both rota changes in one transaction. */
export type RotaMoveAnswer =
  | { dryRun: true; move: RotaMovePlan; strandedVisits: StrandedVisitDto[] }
  | { dryRun: false; move: RotaMovePlan; strandedVisits: StrandedVisitDto[]; timeOffId: number; extraId: number }
