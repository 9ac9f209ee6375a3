// Patient e-mails as the Outbox screen and the public visit page see them.
import type { VisitState } from '../domain/visit-states'
import type { Channel } from '../domain/sms-channels'

/** The four visit messages, two that are texts only (a front desk's own text, the answer to a patient's reply), and the waitlist offer and recall e-mails. */
export const OUTBOX_KINDS = ['invitation', 'update', 'cancellation', 'reminder', 'free_text', 'reply_confirmation', 'offer', 'recall', 'move_offer'] as const
export type OutboxKind = (typeof OUTBOX_KINDS)[number]
export const OUTBOX_STATES = ['queued', 'sending', 'sent', 'failed', 'skipped'] as const
export type OutboxState = (typeof OUTBOX_STATES)[number]

export interface OutboxMessageDto {
  id: number
  kind: OutboxKind
  /** 'email' or 'sms' (a text message). */
  channel: Channel
  state: OutboxState
  /** Texts: the service's last reported status (queued, sent, delivered, failed, undelivered). */
  providerStatus: string | null
  visitId: number | null
  siteId: number | null
  patientName: string | null
  recipient: string | null
  visitStartUtc: string | null
  dueAt: string
  sentAt: string | null
  attempts: number
  lastError: string | null
  messageId: string | null
}

/** The message as sent (or, while queued, as it would be sent now). A text has `to` and `text` only, the rest empty. */
export interface RenderedMessage {
  to: string
  subject: string
  text: string
  html: string
  /** The iCalendar part (RFC 5545), METHOD REQUEST or CANCEL; null for reminders, which carry none. */
  ics: string | null
  method: 'REQUEST' | 'CANCEL' | null
}

export interface OutboxDetailDto extends OutboxMessageDto {
  rendered: RenderedMessage | null
  /** True when `rendered` is a preview of an unsent message, built from the visit as it is now. */
  preview: boolean
}

export type PatientCancelPolicy = 'request' | 'cancel'

/** What a patient sees behind the signed link: no sign-in, only this one visit. */
export interface PublicVisitDto {
  siteName: string
  siteAddress: string
  sitePhone: string
  timeZone: string
  zoneName: string
  startUtc: string
  endUtc: string
  whenLocal: string
  minutes: number
  state: VisitState
  cancelRequested: boolean
  cancelPolicy: PatientCancelPolicy
  canConfirm: boolean
  canCancel: boolean
  icsUrl: string
  /** The patient turned e-mail reminders off. */
  remindersOff: boolean
}

/** A patient's request to cancel, waiting for the front desk. */
export interface CancelRequestDto {
  visitId: number
  siteId: number
  patientName: string
  startUtc: string
  state: VisitState
  requestedAt: string
  rowVersion: number
}

/** A calendar reply (iTIP REPLY) that matched no visit, kept for the Outbox screen. */
export interface UnmatchedReplyDto {
  id: number
  siteId: number | null
  receivedAt: string
  sender: string | null
  subject: string | null
  /** Why it matched nothing, in words. */
  note: string
  partstat: string | null
}
