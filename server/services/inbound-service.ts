// Calendar replies flowing back (issue 15 §2). A patient presses Accept or Decline in their own
// calendar; it mails an iTIP REPLY (RFC 5546 §3.2.3) to the event's ORGANIZER, the site's reply
// address; the inbound-mail service (locally scripts/mail-catcher.ts) posts the raw message here,
// signed. We find the text/calendar METHOD:REPLY part, match UID and ATTENDEE to a visit, ignore an
// answer to an older SEQUENCE (RFC 5546 §2.1.5), and: ACCEPTED → confirmed; DECLINED → a cancel
// request exactly as from the link; TENTATIVE → noted. Each with an audit row. A reply that matches
// nothing is kept for the Outbox screen.
import { simpleParser, type ParsedMail } from 'mailparser'
import ICAL from 'ical.js'
import type { UnmatchedReplyDto } from '#shared/types/outbox'
import type { SessionUser } from '#shared/types/auth'
import { siteOfReplyAddress } from '#shared/domain/reply-address'
import { useDb, type Db } from '../utils/db'
import { inTransaction } from '../utils/db-retry'
import { requireSiteAccess } from '../utils/auth'
import { isDuplicateKey } from '../utils/errors'
import { isValidInboundSignature, type InboundSignedParts } from '../utils/inbound-signature'
import { confirmVisit, findVisitIdByUid, loadMailContext } from '../repositories/mail-context'
import { deliverySeen, insertInboundMail, listUnmatchedReplies, type InboundOutcome } from '../repositories/inbound-mail'
import { writeAudit } from '../repositories/audit-log'
import { patientAsksToCancel } from './visit-link-service'
import { messageRecipient } from './mail/visit-facts'

export interface CalendarReply {
  uid: string
  sequence: number
  attendee: string
  partstat: string
}

function refused() {
  return createError({ statusCode: 401, statusMessage: 'Unauthorized', message: 'This post is not signed, or was seen before.' })
}

function calendarTexts(parsed: ParsedMail): string[] {
  return parsed.attachments
    .filter((part) => part.contentType === 'text/calendar' || part.contentType === 'application/ics' || /\.ics$/i.test(part.filename ?? ''))
    .map((part) => part.content.toString('utf8'))
}

/** The REPLY in a calendar text, or a reason it is not one. */
export function readReply(text: string): CalendarReply | string {
  let calendar: ICAL.Component
  try {
    calendar = new ICAL.Component(ICAL.parse(text))
  } catch {
    return 'the calendar part could not be read'
  }
  if (String(calendar.getFirstPropertyValue('method') ?? '').toUpperCase() !== 'REPLY') return 'the calendar part is not a REPLY (RFC 5546 §3.2.3)'
  const vevent = calendar.getFirstSubcomponent('vevent')
  if (!vevent) return 'the REPLY has no VEVENT'
  const uid = String(vevent.getFirstPropertyValue('uid') ?? '')
  const attendee = vevent.getFirstProperty('attendee')
  if (!uid || !attendee) return 'the REPLY has no UID or no ATTENDEE (RFC 5546 §3.2.3)'
  const address = String(attendee.getFirstValue() ?? '').replace(/^mailto:/i, '').trim().toLowerCase()
  const partstat = String(attendee.getParameter('partstat') ?? '').toUpperCase()
  const sequence = Number(vevent.getFirstPropertyValue('sequence') ?? 0)
  return { uid, sequence: Number.isFinite(sequence) ? sequence : 0, attendee: address, partstat }
}

interface Outcome {
  outcome: InboundOutcome
  visitId: number | null
  siteId: number | null
  partstat: string | null
  note: string
}

async function actOnReply(trx: Db, reply: CalendarReply, siteId: number | null): Promise<Outcome> {
  const unmatched = (note: string): Outcome => ({ outcome: 'unmatched', visitId: null, siteId, partstat: reply.partstat, note })
  const visitId = await findVisitIdByUid(trx, reply.uid)
  const context = visitId === undefined ? undefined : await loadMailContext(trx, visitId)
  if (!context) return unmatched(`no visit has the UID ${reply.uid.slice(0, 200)}`)
  if (siteId !== null && context.site.id !== siteId) return unmatched('sent to another site\'s reply address than the visit\'s')
  // The ATTENDEE of our invitation: the patient's address, or the guardian's for a minor (messageRecipient).
  const recipient = messageRecipient(context, 'email')
  const attendees = [context.patient.email, 'skip' in recipient ? null : recipient.to].filter((address): address is string => Boolean(address)).map((address) => address.toLowerCase())
  if (!attendees.includes(reply.attendee)) return unmatched(`the ATTENDEE ${reply.attendee.slice(0, 200)} is not the visit's patient or their guardian`)
  const matched = (note: string, outcome: InboundOutcome = 'matched'): Outcome => ({ outcome, visitId: context.visit.id, siteId: context.site.id, partstat: reply.partstat, note })
  const { visit } = context
  if (reply.sequence < visit.icalSequence) {
    return matched(`an answer to an older version of the visit (SEQUENCE ${reply.sequence} < ${visit.icalSequence}; RFC 5546 §2.1.5): nothing changed`, 'ignored')
  }
  const audit = (action: string, after: Record<string, unknown>) => writeAudit(trx, {
    userId: null, action, entity: 'visit', entityId: visit.id, before: { state: visit.state }, after: { by: 'calendar reply', partstat: reply.partstat, ...after },
  })
  if (reply.partstat === 'ACCEPTED') {
    if (visit.state === 'booked' && await confirmVisit(trx, visit.id, visit.rowVersion)) {
      await audit('visit_confirmed', { state: 'confirmed' })
      return matched('accepted: the visit is confirmed')
    }
    await audit('visit_reply_noted', { note: `accepted while ${visit.state}` })
    return matched(`accepted while the visit was ${visit.state}: nothing changed`)
  }
  if (reply.partstat === 'DECLINED') {
    try {
      if (await patientAsksToCancel(trx, context, 'calendar reply') !== 'already') return matched('declined: a cancel request for the front desk (or cancelled, by the site\'s policy)')
    } catch {
      // A visit that cannot be cancelled from a link (arrived, in treatment, …): only noted.
    }
    await audit('visit_reply_noted', { note: `declined while ${visit.state}${visit.cancelRequestedAt ? ', cancel already asked' : ''}` })
    return matched(`declined while the visit was ${visit.state}: nothing more to do`)
  }
  await audit(reply.partstat === 'TENTATIVE' ? 'visit_reply_tentative' : 'visit_reply_noted', { note: reply.partstat || 'no PARTSTAT' })
  return matched(`${(reply.partstat || 'no answer').toLowerCase()}: noted`)
}

export interface InboundPost extends InboundSignedParts {
  recipient: string | undefined
  body: Buffer
}

/** One signed post of the inbound-mail service; 401 when unsigned, forged, old or seen before. */
export async function receiveInboundMail(post: InboundPost): Promise<{ outcome: InboundOutcome; note: string }> {
  const { mail } = useRuntimeConfig()
  if (!isValidInboundSignature(String(mail.inboundSecret ?? ''), post, post.body)) throw refused()
  const db = useDb()
  if (await deliverySeen(db, post.id!)) throw refused()
  const raw = post.body.toString('utf8')
  let parsed: ParsedMail | undefined
  try {
    parsed = await simpleParser(post.body)
  } catch {
    parsed = undefined
  }
  const siteId = post.recipient ? siteOfReplyAddress(String(mail.replyAddress ?? ''), post.recipient) : null
  const replies = parsed ? calendarTexts(parsed).map(readReply) : []
  const reply = replies.find((found): found is CalendarReply => typeof found !== 'string')
  try {
    return await inTransaction(async (trx) => {
      const outcome = reply
        ? await actOnReply(trx, reply, siteId)
        : { outcome: 'unmatched' as const, visitId: null, siteId, partstat: null, note: parsed ? (replies.find((found) => typeof found === 'string') ?? 'no calendar part (text/calendar; method=REPLY)') : 'not a readable e-mail' }
      await insertInboundMail(trx, {
        deliveryId: post.id!, siteId: outcome.siteId, visitId: outcome.visitId, outcome: outcome.outcome, partstat: outcome.partstat,
        sender: parsed?.from?.value[0]?.address ?? null, subject: parsed?.subject ?? null, note: outcome.note, raw,
      })
      return { outcome: outcome.outcome, note: outcome.note }
    })
  } catch (error) {
    // The same delivery posted twice at once: the second is a replay.
    if (isDuplicateKey(error)) throw refused()
    throw error
  }
}

export async function unmatchedReplies(siteId: number | undefined, user: SessionUser): Promise<UnmatchedReplyDto[]> {
  if (siteId !== undefined) requireSiteAccess(user, siteId)
  return listUnmatchedReplies(useDb(), { siteIds: user.allSites ? 'all' : user.siteIds, siteId })
}
