// The patient's recall page (issue 17 §1) as the API gives it: no sign-in, the signed link is the key.
import type { RecallKind } from '../domain/recall'
import type { PublicSiteFacts } from './display'

/** One time the patient may pick: the chair and provider go back with the choice. */
export interface RecallOpeningDto {
  startUtc: string
  startLocalIso: string
  operatoryId: number
  providerId: number
}

export interface PublicRecallDto extends PublicSiteFacts {
  firstName: string
  kind: RecallKind
  dueDate: string
  /** What the patient will have: the plan's procedure name(s), and their minutes in the chair. */
  what: string
  minutes: number
  /** 'open': pick a time; 'booked': a visit of this kind is booked (its start below). */
  state: 'open' | 'booked'
  bookedStartUtc: string | null
  /** Up to RECALL_PAGE_OPENINGS times, earliest first; empty when none in the next weeks. */
  openings: RecallOpeningDto[]
}
