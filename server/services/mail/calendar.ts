// The visit as an iCalendar object (RFC 5545) for iTIP (RFC 5546): METHOD REQUEST for a new or
// changed visit, CANCEL for a cancelled one. Times are UTC, so no VTIMEZONE is needed (RFC 5546 §3.2.2).
// Written line by line (shared/domain/icalendar.ts): parameter values encoded per RFC 6868, lines
// folded at 75 octets. The event is the patient's time, seating to dismissal: the room's reset after
// the patient leaves is chair time, not theirs.
import { escapeText, utcDateTime, writeLines, type ContentLine } from '#shared/domain/icalendar'
import type { MailContext } from '../../repositories/mail-context'
import { messageRecipient, type VisitFacts } from './visit-facts'

export type CalendarMethod = 'REQUEST' | 'CANCEL'

export function methodFor(context: MailContext): CalendarMethod {
  return context.visit.state === 'cancelled' ? 'CANCEL' : 'REQUEST'
}

/** The patient's span: from the visit's start for the minutes they are in the chair. */
export function patientSpan(context: MailContext, facts: VisitFacts): { startMs: number; endMs: number } {
  const startMs = context.visit.startUtc.getTime()
  return { startMs, endMs: startMs + facts.minutes * 60_000 }
}

export interface CalendarOptions {
  /** The ORGANIZER address: the site's reply address that Cuspline receives (see reply-address.ts). */
  organizerEmail: string
  nowMs?: number
}

export function visitCalendar(context: MailContext, facts: VisitFacts, method: CalendarMethod, options: CalendarOptions): string {
  const { visit, site, patient } = context
  const { startMs, endMs } = patientSpan(context, facts)
  const title = `${facts.what} at ${site.name}`
  // The attendee is whoever the message goes to: the patient, or a minor's guardian (visit-facts.ts).
  const recipient = messageRecipient(context, 'email')
  const attendee = 'skip' in recipient ? { name: `${patient.firstName} ${patient.lastName}`, to: patient.email ?? '' } : recipient
  const lines: ContentLine[] = [
    { name: 'BEGIN', value: 'VCALENDAR' },
    { name: 'VERSION', value: '2.0' },
    { name: 'PRODID', value: '-//Cuspline//Patient visits//EN' },
    { name: 'CALSCALE', value: 'GREGORIAN' },
    { name: 'METHOD', value: method },
    { name: 'BEGIN', value: 'VEVENT' },
    { name: 'UID', value: visit.icalUid },
    { name: 'SEQUENCE', value: String(visit.icalSequence) },
    // RFC 5545 §3.8.7.2: DTSTAMP in UTC.
    { name: 'DTSTAMP', value: utcDateTime(options.nowMs ?? Date.now()) },
    { name: 'DTSTART', value: utcDateTime(startMs) },
    { name: 'DTEND', value: utcDateTime(endMs) },
    { name: 'SUMMARY', value: escapeText(title) },
    { name: 'DESCRIPTION', value: escapeText(`Plan for ${facts.howLong}. Please bring ${facts.settings.whatToBring}. To change or cancel, call ${site.name} at ${site.phone}.`) },
    { name: 'LOCATION', value: escapeText([site.name, site.address].filter(Boolean).join(', ')) },
    { name: 'STATUS', value: method === 'CANCEL' ? 'CANCELLED' : 'CONFIRMED' },
    { name: 'TRANSP', value: 'OPAQUE' },
    { name: 'CLASS', value: 'PRIVATE' },
    { name: 'ORGANIZER', params: [['CN', site.name]], value: `mailto:${options.organizerEmail}` },
    {
      name: 'ATTENDEE',
      params: [['CUTYPE', 'INDIVIDUAL'], ['ROLE', 'REQ-PARTICIPANT'], ['PARTSTAT', 'NEEDS-ACTION'], ...(method === 'REQUEST' ? [['RSVP', 'TRUE'] as [string, string]] : []), ['CN', attendee.name]],
      value: `mailto:${attendee.to}`,
    },
  ]
  // RFC 5546 §3.2.5: a CANCEL carries no VALARM.
  if (method === 'REQUEST') {
    lines.push(
      { name: 'BEGIN', value: 'VALARM' },
      { name: 'ACTION', value: 'DISPLAY' },
      { name: 'DESCRIPTION', value: escapeText(title) },
      { name: 'TRIGGER', value: `-PT${Math.max(0, Math.round(facts.settings.alarmMinutes))}M` },
      { name: 'END', value: 'VALARM' },
    )
  }
  lines.push({ name: 'END', value: 'VEVENT' }, { name: 'END', value: 'VCALENDAR' })
  return writeLines(lines)
}
