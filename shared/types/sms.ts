// Text messages as the Outbox screen and the visit panel see them.

/** A text from a patient, with what Cuspline did about it. */
export interface SmsReplyDto {
  id: number
  fromNumber: string
  body: string
  patientId: number | null
  patientName: string | null
  visitId: number | null
  visitStartUtc: string | null
  siteId: number | null
  /** confirmed, already_confirmed, cancel_requested, cancelled, opted_out, opted_in, unanswered, no_visit, unknown_number */
  outcome: string
  receivedAt: string
  answeredAt: string | null
}

/** One line of a visit's text thread. */
export interface TextThreadEntry {
  direction: 'out' | 'in'
  id: number
  /** Outgoing: the outbox kind; incoming: 'reply'. */
  kind: string
  text: string | null
  /** Outgoing: the outbox state; incoming: the reply's outcome. */
  state: string
  /** Outgoing: the service's delivery status; incoming: 'answered' once the front desk marked it. */
  status: string | null
  at: string
  /** Why an outgoing text waits, was skipped or failed. */
  note: string | null
}

export interface TextThreadDto {
  visitId: number
  /** The patient's number as texts go to it (E.164), or null when it cannot take texts. */
  number: string | null
  /** Why the front desk cannot text this patient now, or null. */
  blocked: string | null
  entries: TextThreadEntry[]
}
