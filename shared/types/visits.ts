// Visits as the API returns them.
import type { StepKind, VisitPlan } from './chair-time'
import type { VisitState } from '../domain/visit-states'

export interface SegmentDto {
  kind: StepKind
  label: string
  operatoryId: number
  providerId: number
  startUtc: string
  endUtc: string
}

export interface VisitDto {
  id: number
  siteId: number
  operatoryId: number
  providerId: number
  patientId: number
  startUtc: string
  endUtc: string
  state: VisitState
  note: string
  cancelReason: string | null
  /** When the patient asked to cancel through the e-mail link (the front desk decides), or null. */
  cancelRequestedAt: string | null
  rowVersion: number
  icalUid: string
  icalSequence: number
  plan: VisitPlan
  segments: SegmentDto[]
  /** The state before the last staff change, which can be undone on the same local day (issue 13 §3), or null. */
  previousState: VisitState | null
  /** When that change was made (UTC), or null. */
  stateChangedAt: string | null
  /** When the anaesthetic was given (UTC), or null: the numbing countdown runs from it (issue 13 §4). */
  anaestheticGivenAt: string | null
}

/** What a 409 says about the booking it collided with. */
export interface BookingConflict {
  resource: 'operatory' | 'provider' | 'patient'
  id: number
  name: string
  startUtc: string
  endUtc: string
  visitId: number | null
}

export interface PatientDto {
  id: number
  firstName: string
  lastName: string
  dateOfBirth: string
  email: string | null
  phone: string | null
  preferredSiteId: number | null
  emailConsent: boolean
}

export interface OpeningDto {
  siteId: number
  siteName: string
  operatoryId: number
  operatoryName: string
  providerId: number
  providerName: string
  startUtc: string
  endUtc: string
  startLocalIso: string
  timeZone: string
  /** False for a site outside the caller's scope (shown with a whole-group search; booking there is refused). */
  inScope: boolean
}

export interface OpeningsResponse {
  plan: VisitPlan
  openings: OpeningDto[]
  reasons: string[]
}

/** What the booking drawer hands the screen after a booking: the visit and, in words, who, when and where. */
export interface BookedVisit {
  visit: VisitDto
  /** e.g. "Ada Lovelace, Tue 8 Dec 10:30, Room 2 at Fernhollow North, with Dr Ng". */
  summary: string
  /** The visit's local date at its site (yyyy-MM-dd), for a jump to that day. */
  localDate: string
}

/** A visit as the Chairboard, My day and week views draw it. */
export interface BoardVisitDto extends VisitDto {
  patientName: string
  /** For the printed day sheet and calls from the board; null when none is on record. */
  patientPhone: string | null
  /** The patient record's alert for the front desk and the chair (a few words), or null. */
  patientAlert: string | null
  providerName: string
  providerInitials: string
  /** e.g. "Posterior composite 19 MO" per item, in the site's tooth notation. */
  procedures: string[]
  /** Set while the visit is stranded (glossary: it "needs a new time"): why, in plain words. */
  strandedReason: string | null
}
