// The visit as an iCalendar object (RFC 5545) for iTIP (RFC 5546): METHOD REQUEST for a new or
// changed visit, CANCEL for a cancelled one. Times are UTC, so no VTIMEZONE is needed (RFC 5546 §3.2.2).
import { createEvent, type EventAttributes } from 'ics'
import type { MailContext } from '../../repositories/mail-context'
import type { VisitFacts } from './visit-facts'

export type CalendarMethod = 'REQUEST' | 'CANCEL'

export function methodFor(context: MailContext): CalendarMethod {
  return context.visit.state === 'cancelled' ? 'CANCEL' : 'REQUEST'
}

export function visitCalendar(context: MailContext, facts: VisitFacts, method: CalendarMethod, nowMs = Date.now()): string {
  const { visit, site, patient } = context
  const attributes: EventAttributes = {
    productId: '-//Cuspline//Patient visits//EN',
    method,
    uid: visit.icalUid,
    sequence: visit.icalSequence,
    // ics names DTSTAMP "timestamp" (RFC 5545 §3.8.7.2: UTC).
    ...({ timestamp: nowMs } as object),
    start: visit.startUtc.getTime(), startInputType: 'utc', startOutputType: 'utc',
    end: visit.endUtc.getTime(), endInputType: 'utc', endOutputType: 'utc',
    title: `${facts.what} at ${site.name}`,
    description: `Plan for ${facts.howLong}. Please bring ${facts.settings.whatToBring}. To change or cancel, call ${site.name} at ${site.phone}.`,
    location: [site.name, site.address].filter(Boolean).join(', '),
    status: method === 'CANCEL' ? 'CANCELLED' : 'CONFIRMED',
    busyStatus: 'BUSY',
    classification: 'PRIVATE',
    organizer: { name: site.name, email: site.email },
    attendees: [{
      name: `${patient.firstName} ${patient.lastName}`, email: patient.email ?? undefined,
      rsvp: method === 'REQUEST', partstat: 'NEEDS-ACTION', role: 'REQ-PARTICIPANT', cutype: 'INDIVIDUAL',
    }],
    // RFC 5546 §3.2.5: a CANCEL carries no VALARM.
    ...(method === 'REQUEST' ? { alarms: [{ action: 'display', description: `${facts.what} at ${site.name}`, trigger: { minutes: facts.settings.alarmMinutes, before: true } }] } : {}),
  }
  const { error, value } = createEvent(attributes)
  if (error || !value) throw new Error(`could not build the calendar event: ${error?.message ?? 'no output'}`)
  return value
}
