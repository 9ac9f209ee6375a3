// Move offers (issue 17 §3): Balance's "consolidate" suggestion e-mailed and/or texted to the patient, who may move
// the visit to the proposed time or keep the current one.
import type { PublicSiteFacts } from './display'
import type { Channel } from '../domain/sms-channels'

export const MOVE_OFFER_STATES = ['sent', 'accepted', 'declined', 'expired', 'taken'] as const
export type MoveOfferState = (typeof MOVE_OFFER_STATES)[number]

export interface SentMoveOfferDto {
  moveOfferId: number
  visitId: number
  startUtc: string
  expiresAtUtc: string
  /** The channels the offer went by: e-mail and/or text. */
  channels: Channel[]
}

export interface PublicMoveOfferDto extends PublicSiteFacts {
  /** The visit's time now, and the time proposed. */
  currentStartUtc: string
  currentEndUtc: string
  startUtc: string
  endUtc: string
  expiresAtUtc: string
  state: MoveOfferState
  /** Words for the page when the offer is no longer open. */
  message: string
}
