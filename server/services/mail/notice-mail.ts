// Patient e-mails that are not about a booked visit (issue 17): a waitlist offer of a freed time and a
// recall ("time for your cleaning"). Plain text and HTML in the site's voice, no calendar part.
import type { SendMailOptions } from 'nodemailer'
import type { RenderedMessage } from '#shared/types/outbox'
import type { SiteDetail } from '#shared/types/sites'
import { displayStyleOf, formatDateTime, formatLocalDate, zoneLabel } from '#shared/utils/display-time'
import { RECALL_KIND_LABELS, type RecallKind } from '#shared/domain/recall'

export interface NoticePatient {
  firstName: string
  lastName: string
  /** Where the e-mail goes: the patient's address, or for a minor the guardian's (recipientOf). */
  email: string
  /** The name after "Hello" and on the envelope when not the patient's own (a guardian). */
  greeting?: string
  envelopeName?: string
  /** The patient's full name when the message goes to their guardian. */
  onBehalfOf?: string | null
}

interface Notice {
  site: SiteDetail
  patient: NoticePatient
  subject: string
  paragraphs: string[]
  button?: { href: string; label: string }
  why: string
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (char) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[char]!)
}

function composeNotice(notice: Notice, options: { from: string; messageId?: string }): { rendered: RenderedMessage; mail: SendMailOptions } {
  const { site, patient } = notice
  const greeting = patient.greeting ?? patient.firstName
  const paragraphs = patient.onBehalfOf ? [`We are writing to you as the parent or guardian of ${patient.onBehalfOf}.`, ...notice.paragraphs] : notice.paragraphs
  const text = [
    `Hello ${greeting},`, '', ...paragraphs.flatMap((line) => [line, '']),
    ...(notice.button ? [`${notice.button.label}: ${notice.button.href}`, ''] : []),
    `Questions? Call us at ${site.phone}.`, '', notice.why,
  ].join('\n')
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${escapeHtml(notice.subject)}</title></head>
<body style="margin:0;padding:0;background:#f4f2ee;font-family:Helvetica,Arial,sans-serif;color:#1c1b19;line-height:1.5;font-size:16px">
<div style="max-width:600px;margin:0 auto;background:#ffffff">
<div data-part="site" style="background:${escapeHtml(site.colour)};color:#ffffff;padding:14px 20px;font-size:18px;font-weight:600">${escapeHtml(site.name)}</div>
<div style="padding:16px 20px">
<p>Hello ${escapeHtml(greeting)},</p>
${paragraphs.map((line) => `<p>${escapeHtml(line)}</p>`).join('\n')}
${notice.button ? `<p style="margin:16px 0"><a href="${escapeHtml(notice.button.href)}" style="display:inline-block;background:#1f4f8a;color:#ffffff;padding:12px 18px;border-radius:6px;text-decoration:none;font-weight:600">${escapeHtml(notice.button.label)}</a></p>` : ''}
<p>Questions? Call us at ${escapeHtml(site.phone)}.</p>
</div>
<div data-part="footer" style="padding:14px 20px;border-top:1px solid #e2ded6;color:#5b5850;font-size:14px">
<p style="margin:0 0 8px">${escapeHtml(site.name)}<br>${escapeHtml(site.address)}<br>${escapeHtml(site.phone)}</p>
<p style="margin:0">${escapeHtml(notice.why)}</p>
</div></div></body></html>`
  const rendered: RenderedMessage = { to: patient.email, subject: notice.subject, text, html, ics: null, method: null }
  return {
    rendered,
    mail: {
      from: { name: site.name, address: options.from || site.email },
      replyTo: site.email || undefined,
      to: { name: (patient.envelopeName ?? `${patient.firstName} ${patient.lastName}`).trim(), address: patient.email },
      subject: notice.subject, text, html,
      // RFC 3834 §5: sent by a program, not a person.
      headers: { 'Auto-Submitted': 'auto-generated' },
      ...(options.messageId ? { messageId: options.messageId } : {}),
    },
  }
}

export interface OfferMailFacts {
  site: SiteDetail
  patient: NoticePatient
  startMs: number
  expiresAtMs: number
  link: string
}

export function composeOfferMail(facts: OfferMailFacts, options: { from: string; messageId?: string }) {
  const { site } = facts
  const style = displayStyleOf(site)
  const when = formatDateTime(facts.startMs, style, 'long')
  return composeNotice({
    site, patient: facts.patient,
    subject: `An earlier time at ${site.name}: ${formatDateTime(facts.startMs, style, 'short')}`,
    paragraphs: [
      `A time has become free at ${site.name} and you are on our waiting list. The first person to accept it gets it.`,
      `When: ${when} (${zoneLabel(site.timeZone, facts.startMs)}). Where: ${[site.name, site.address].filter(Boolean).join(', ')}.`,
      `The offer is open until ${formatDateTime(facts.expiresAtMs, style, 'short')}. If someone accepts first, you stay on the waiting list.`,
    ],
    button: { href: facts.link, label: 'See the time and accept' },
    why: `You got this e-mail because you asked ${site.name} for an earlier time.`,
  }, options)
}

export interface RecallMailFacts {
  site: SiteDetail
  patient: NoticePatient
  kind: RecallKind
  dueDate: string
  /** The signed recall page (`/recall-times/<token>`) where the patient picks a time; absent in a preview. */
  link?: string
}

export function composeRecallMail(facts: RecallMailFacts, options: { from: string; messageId?: string }) {
  const { site } = facts
  const style = displayStyleOf(site)
  const what = RECALL_KIND_LABELS[facts.kind].toLowerCase()
  return composeNotice({
    site, patient: facts.patient,
    subject: `Time for your ${what} at ${site.name}`,
    paragraphs: [
      `Your next regular ${what} at ${site.name} is due on ${formatLocalDate(facts.dueDate, style, 'long')}.`,
      facts.link
        ? 'Pick a time that suits you from the free times on our page, or call us at the number below and we will find one together.'
        : `Please call us at ${site.phone} or reply to this e-mail, and we will find a time that suits you.`,
    ],
    ...(facts.link ? { button: { href: facts.link, label: 'Choose a time' } } : {}),
    why: `You got this e-mail because you are a patient of ${site.name} and agreed to hear from us by e-mail.`,
  }, options)
}

export interface MoveOfferMailFacts {
  site: SiteDetail
  /** From `messageRecipient`: the guardian for a minor, with the patient's name in `onBehalfOf`. */
  recipient: { greeting: string; to: string; onBehalfOf: string | null }
  fromStartMs: number
  startMs: number
  expiresAtMs: number
  link: string
}

/** A move offer (issue 17 §3): an earlier or better-placed time for a booked visit; nothing moves unless the patient accepts. */
export function composeMoveOfferMail(facts: MoveOfferMailFacts, options: { from: string; messageId?: string }) {
  const { site } = facts
  const style = displayStyleOf(site)
  const whose = facts.recipient.onBehalfOf ? `The dental visit for ${facts.recipient.onBehalfOf}` : 'Your visit'
  return composeNotice({
    site, patient: { firstName: facts.recipient.greeting, lastName: '', email: facts.recipient.to },
    subject: `Could your visit at ${site.name} move to ${formatDateTime(facts.startMs, style, 'short')}?`,
    paragraphs: [
      `${whose} is booked for ${formatDateTime(facts.fromStartMs, style, 'long')} (${zoneLabel(site.timeZone, facts.fromStartMs)}).`,
      `We could see you at ${formatDateTime(facts.startMs, style, 'long')} instead, which helps us keep our day together. Nothing changes unless you agree.`,
      `You can answer until ${formatDateTime(facts.expiresAtMs, style, 'short')}. If you do nothing, the visit stays as booked.`,
    ],
    button: { href: facts.link, label: 'See both times and answer' },
    why: `You got this e-mail because you have a visit booked at ${site.name} and agreed to hear from us by e-mail.`,
  }, options)
}
