// Who a patient message goes to (issue 16 §1): the patient, or for a minor their guardian. A patient
// under ADULT_FROM_YEARS on the visit's date (age from the date of birth, the date taken in the site's
// zone) is written to through the guardian's e-mail or phone; without one the message is skipped with
// the reason in words, never sent to the child. Pure: the dispatcher hands in the patient and the date.
import { ADULT_FROM_YEARS, ageInYears } from './booking-warnings'

export interface RecipientPatient {
  firstName: string
  lastName: string
  /** yyyy-MM-dd, or null when unknown (then treated as an adult: nobody to ask instead). */
  dateOfBirth: string | null
  email: string | null
  phone: string | null
  guardianName: string | null
  guardianEmail: string | null
  guardianPhone: string | null
}

export interface Recipient {
  /** The e-mail address or the phone number as stored (texts read it with toE164). */
  to: string
  /** The name on the envelope: the patient's, or the guardian's. */
  name: string
  /** The name after "Hello". */
  greeting: string
  /** The patient's full name when the message goes to their guardian, else null. */
  onBehalfOf: string | null
}

export type RecipientChoice = Recipient | { skip: string }

/** Whether the patient is under ADULT_FROM_YEARS on `onDate` (yyyy-MM-dd). */
export function isMinorOn(dateOfBirth: string | null, onDate: string): boolean {
  if (!dateOfBirth || !/^\d{4}-\d{2}-\d{2}$/.test(dateOfBirth)) return false
  return ageInYears(dateOfBirth, onDate) < ADULT_FROM_YEARS
}

function guardianGreeting(patient: RecipientPatient): string {
  return patient.guardianName?.trim() || `parent or guardian of ${patient.firstName}`
}

/**
 * The recipient of a message on `channel` about a visit on `onDate`: the patient's own contact, or
 * for a minor the guardian's. Without a contact the skip reason is in words for the Outbox.
 */
export function recipientOf(patient: RecipientPatient, channel: 'email' | 'sms', onDate: string): RecipientChoice {
  const fullName = `${patient.firstName} ${patient.lastName}`
  if (isMinorOn(patient.dateOfBirth, onDate)) {
    const contact = channel === 'email' ? patient.guardianEmail : patient.guardianPhone
    if (!contact?.trim()) {
      const what = channel === 'email' ? 'e-mail address' : 'mobile number'
      return { skip: `the patient is under ${ADULT_FROM_YEARS} and no guardian ${what} is on file: not sent to the child` }
    }
    const guardian = guardianGreeting(patient)
    return { to: contact.trim(), name: patient.guardianName?.trim() || guardian, greeting: guardian, onBehalfOf: fullName }
  }
  const contact = channel === 'email' ? patient.email : patient.phone
  if (!contact) return { skip: channel === 'email' ? 'the patient has no e-mail address' : 'the patient has no mobile number that can take texts' }
  return { to: contact, name: fullName, greeting: patient.firstName, onBehalfOf: null }
}
