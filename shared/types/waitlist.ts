// The waitlist and offers (issue 17 §2) as the API gives them.
import type { ChairTimeRequest } from '../schemas/templates'
import type { PartOfDay } from './openings'
import type { PublicSiteFacts } from './display'
import type { Channel } from '../domain/sms-channels'

type ChairTimeItem = ChairTimeRequest['items'][number]

export type WaitlistState = 'open' | 'booked' | 'closed'
export type OfferState = 'sent' | 'accepted' | 'taken' | 'expired' | 'refused'

export interface WaitlistEntryDto {
  id: number
  patientId: number
  patientName: string
  patientEmail: string | null
  emailConsent: boolean
  siteId: number
  siteIds: number[]
  items: ChairTimeItem[]
  /** Procedure codes of the plan, for lists ("FILL2, EXAM"). */
  planLabel: string
  from: string
  to: string
  partOfDay: PartOfDay
  noticeMinutes: number
  priority: number
  note: string
  state: WaitlistState
  bookedVisitId: number | null
  createdAtUtc: string
}

/** One entry that fits a freed gap, with the earliest start it can take there. */
export interface WaitlistMatchDto {
  entry: WaitlistEntryDto
  siteId: number
  operatoryId: number
  providerId: number
  providerName: string
  startUtc: string
  endUtc: string
  startLocalIso: string
  /** False when neither e-mail nor text reaches the patient (or a minor's guardian). */
  canOffer: boolean
  /** How an offer would go now: the site's choice narrowed to consent and contact (`offerChannels`). */
  channels: Channel[]
  /** Offers already open for this entry at this time. */
  offered: boolean
  /** The channels the open offer went by (empty when none is open). */
  offeredBy: Channel[]
}

export interface WaitlistMatchesDto {
  /** `operatoryId` null: every chair of the site (a new shift or extra day). */
  gap: { siteId: number; operatoryId: number | null; startUtc: string; endUtc: string }
  matches: WaitlistMatchDto[]
}

export interface SentOffersDto {
  /** Each offer made, with the channels it went by (e-mail and/or text). */
  sent: Array<{ offerId: number; entryId: number; expiresAtUtc: string; channels: Channel[] }>
  /** Entries not offered, with the reason in words. */
  skipped: Array<{ entryId: number; reason: string }>
}

/** What the patient's offer page shows (no sign-in). */
export interface PublicOfferDto extends PublicSiteFacts {
  startUtc: string
  startLocalIso: string
  minutes: number
  expiresAtUtc: string
  state: OfferState
  /** Words for the page when the offer is no longer open. */
  message: string
}

/**
 * Provider time a new shift or extra day added (issue 17 §2): a gap across every chair of the site,
 * asked of the waitlist with GET /api/waitlist/matches?siteId&startUtc&endUtc (no operatoryId).
 */
export interface FreedWindowDto {
  siteId: number
  startUtc: string
  endUtc: string
}
