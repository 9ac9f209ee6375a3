// The text-message form of each patient message: short, the site's name, the local date and time,
// and the signed link to the visit page. Never a procedure, tooth or surface (HHS OCR guidance on
// appointment reminders: minimum necessary, 45 CFR 164.502(b)).

export type TextKind = 'invitation' | 'update' | 'cancellation' | 'reminder'

export interface TextFacts {
  siteName: string
  sitePhone: string
  /** "Mon 11 Jan, 9:00 AM", in the site's zone */
  when: string
  link: string
  /** For a minor's visit the text goes to the guardian: greet them and name the patient (given name only: minimum necessary). */
  guardian?: { greeting: string; patientFirstName: string }
}

export function visitText(kind: TextKind, facts: TextFacts): string {
  const hello = facts.guardian ? `Hello ${facts.guardian.greeting}, ` : ''
  const whose = facts.guardian ? `${facts.guardian.patientFirstName}'s visit` : 'your visit'
  const head = `${facts.siteName}: ${hello}`
  switch (kind) {
    case 'invitation':
      return `${head}${whose} is booked for ${facts.when}. Reply C to confirm or X to cancel. ${facts.link}`
    case 'update':
      return `${head}${whose} has moved to ${facts.when}. Reply C to confirm or X to cancel. ${facts.link}`
    case 'cancellation':
      return `${head}${whose} on ${facts.when} is cancelled. Call ${facts.sitePhone} to book again.`
    case 'reminder':
      return `${head}reminder of ${whose} on ${facts.when}. Reply C to confirm or X to cancel. ${facts.link}`
  }
}

export interface OfferTextFacts {
  siteName: string
  /** The offered time, "Tue, Dec 8, 9:00 AM" in the site's clock and date order (formatDateTime 'short'). */
  when: string
  /** When the link closes, the same way. */
  until: string
  link: string
  /** A minor's offer goes to the guardian: greet them and name the patient (given name only). */
  guardian?: { greeting: string; patientFirstName: string }
}

/**
 * A waitlist offer (issue 17 §2) as a text: a freed time, first to accept gets it, the signed offer
 * link. No plan or procedure (minimum necessary, as visit texts). No reply keywords: the link answers.
 */
export function offerText(facts: OfferTextFacts): string {
  const hello = facts.guardian ? `Hello ${facts.guardian.greeting}, ` : ''
  const whom = facts.guardian ? ` for ${facts.guardian.patientFirstName}` : ''
  return `${facts.siteName}: ${hello}a dental visit time has come free${whom}: ${facts.when}. The first to accept gets it. Open until ${facts.until}: ${facts.link}`
}

export interface MoveOfferTextFacts extends OfferTextFacts {
  /** The visit's time now, the same way. */
  from: string
}

/** A move offer (issue 17 §3) as a text: both times, nothing moves unless they accept, the signed link. */
export function moveOfferText(facts: MoveOfferTextFacts): string {
  const hello = facts.guardian ? `Hello ${facts.guardian.greeting}, ` : ''
  const whose = facts.guardian ? `${facts.guardian.patientFirstName}'s visit` : 'your visit'
  return `${facts.siteName}: ${hello}could ${whose} on ${facts.from} move to ${facts.when}? It stays as booked unless you accept by ${facts.until}: ${facts.link}`
}

export type ReplyOutcome = 'confirmed' | 'already_confirmed' | 'cancel_requested' | 'cancelled' | 'opted_out' | 'opted_in' | 'unanswered' | 'no_visit' | 'offer_reply'

/** The short answer to a patient's reply. */
export function replyConfirmationText(outcome: ReplyOutcome, facts: { siteName: string; sitePhone: string; when: string | null }): string {
  const on = facts.when ? ` on ${facts.when}` : ''
  switch (outcome) {
    case 'confirmed':
    case 'already_confirmed':
      return `${facts.siteName}: thank you, your visit${on} is confirmed.`
    case 'cancel_requested':
      return `${facts.siteName}: thank you, we have your request to cancel your visit${on}. We will be in touch.`
    case 'cancelled':
      return `${facts.siteName}: your visit${on} is cancelled. Call ${facts.sitePhone} to book again.`
    case 'opted_out':
      return `${facts.siteName}: you will get no more texts from us. Reply START to get them again.`
    case 'opted_in':
      return `${facts.siteName}: texts are on again. Reply STOP to stop them.`
    case 'no_visit':
      return `${facts.siteName}: we found no visit waiting for your answer. Please call ${facts.sitePhone}.`
    case 'unanswered':
      return `${facts.siteName}: thank you, the front desk has your message.`
    case 'offer_reply':
      // A reply to a waitlist offer or a move offer: only its link answers it (no keyword does).
      return `${facts.siteName}: thank you, the front desk has your message. To answer our offer, please use the link in our text.`
  }
}

