// Recall (issue 17 §1) as the API gives it.
import type { RecallKind } from '../domain/recall'

export interface RecallDto {
  id: number
  patientId: number
  patientName: string
  firstName: string
  lastName: string
  email: string | null
  emailConsent: boolean
  phone: string | null
  kind: RecallKind
  dueDate: string
  lastContactUtc: string | null
  lastVisitUtc: string | null
  preferredSiteId: number | null
}

export interface RecallMailResult {
  /** The message as the first chosen patient would get it. */
  preview: { to: string; subject: string; text: string } | null
  sent: number[]
  skipped: Array<{ recallId: number; reason: string }>
}

/** A patient's recall interval per kind: their own (`months`) or, when null, the site's default. */
export interface RecallIntervalDto {
  kind: RecallKind
  months: number | null
  /** The default of the patient's preferred site (or the group default when none). */
  siteMonths: number
  /** What applies now: `months ?? siteMonths`. */
  effectiveMonths: number
}
