// Warnings the booking drawer shows before a booking: things worth a second look that the server does
// not refuse (issue 14, "The booking drawer"). Pure: the screen hands in the patient, the plan and the
// patient's other visits; the words come back.
import type { OperatoryCapability } from '../types/chair-time'

/** Less than this between a visit at one site and one at another leaves little time to travel. */
export const TRAVEL_MARGIN_MINUTES = 60
/**
 * Procedures meant for children: a patient of this age or older booked for one gets a warning.
 * 18 is the usual age of majority (common practice, no source); the practice decides.
 */
export const ADULT_FROM_YEARS = 18

export interface WarningProcedure {
  name: string
  capability: OperatoryCapability
}

export interface OtherVisit {
  siteId: number
  siteName: string
  startUtc: string
  endUtc: string
  /** "HH:mm" at that visit's own site, for the words. */
  localStartText: string
  localEndText: string
}

export interface BookingWarningInput {
  siteId: number
  startMs: number
  endMs: number
  /** The visit's local date at its site (yyyy-MM-dd). */
  visitDate: string
  /** yyyy-MM-dd, or null when unknown. */
  patientBirthDate: string | null
  procedures: readonly WarningProcedure[]
  otherVisits: readonly OtherVisit[]
}

/** Whole years from `birthDate` to `onDate`, both yyyy-MM-dd. */
export function ageInYears(birthDate: string, onDate: string): number {
  const [by, bm, bd] = birthDate.split('-').map(Number) as [number, number, number]
  const [y, m, d] = onDate.split('-').map(Number) as [number, number, number]
  return y - by - (m < bm || (m === bm && d < bd) ? 1 : 0)
}

export function bookingWarnings(input: BookingWarningInput): string[] {
  const warnings: string[] = []
  const margin = TRAVEL_MARGIN_MINUTES * 60_000
  for (const other of input.otherVisits) {
    if (other.siteId === input.siteId) continue
    const otherStart = Date.parse(other.startUtc)
    const otherEnd = Date.parse(other.endUtc)
    if (otherEnd <= input.startMs && input.startMs - otherEnd < margin) {
      warnings.push(`The patient has a visit at ${other.siteName} ending ${other.localEndText}, less than an hour before this one: is there time to get here?`)
    } else if (otherStart >= input.endMs && otherStart - input.endMs < margin) {
      warnings.push(`The patient has a visit at ${other.siteName} starting ${other.localStartText}, less than an hour after this one ends: is there time to get there?`)
    }
  }
  if (input.patientBirthDate) {
    const age = ageInYears(input.patientBirthDate, input.visitDate)
    for (const procedure of input.procedures) {
      if (procedure.capability === 'pediatric' && age >= ADULT_FROM_YEARS) {
        warnings.push(`${procedure.name} is a procedure for children, and the patient will be ${age}.`)
      }
    }
  }
  return [...new Set(warnings)]
}
