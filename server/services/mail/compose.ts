// Patient e-mails in the site's voice: text and HTML parts, plus one calendar part (RFC 6047 §2.4)
// for invitations, updates and cancellations. Reminders are plain messages with the visit's details
// and links, and carry a one-click way to stop reminders (RFC 8058). Only what the patient needs
// (practice, time, place, phone; HHS minimum necessary): no procedure, tooth or surface unless the
// site turns includeProcedureNames on.
import type { SendMailOptions } from 'nodemailer'
import type { OutboxKind, RenderedMessage } from '#shared/types/outbox'
import type { MailContext } from '../../repositories/mail-context'
import type { OutboxPayload } from '../../repositories/outbox'
import { durationWords, messageRecipient, visitFacts, type VisitFacts } from './visit-facts'
import { ADULT_FROM_YEARS } from '#shared/domain/booking-warnings'
import type { Recipient } from '#shared/domain/message-recipient'
import { methodFor, visitCalendar } from './calendar'

export interface PatientLinks {
  visitPage: string
  confirm: string
  cancel: string
  ics: string
  /** The page where the patient turns reminders off (the visible link). */
  stopReminders: string
  /** The one-click POST target of List-Unsubscribe (RFC 8058 §3.1). */
  unsubscribePost: string
}

interface Wording {
  subject: string
  intro: string
}

/** How the message names the visit: "your dental visit", or for a guardian "the dental visit for Mia Reyes". */
interface Voice {
  your: string
  Your: string
  /** The line under the greeting telling a guardian why they get it, or null. */
  guardianLine: string | null
}

function voiceOf(recipient: Recipient): Voice {
  if (!recipient.onBehalfOf) return { your: 'your dental visit', Your: 'Your dental visit', guardianLine: null }
  return {
    your: `the dental visit for ${recipient.onBehalfOf}`,
    Your: `The dental visit for ${recipient.onBehalfOf}`,
    guardianLine: `You are getting this message as the parent or guardian of ${recipient.onBehalfOf}, who is under ${ADULT_FROM_YEARS}.`,
  }
}

function changeWords(site: string, facts: VisitFacts, change: OutboxPayload['change'], voice: Voice): string {
  if (!change) return `The details of ${voice.your} at ${site} have changed. Here they are as they stand now.`
  const before = change.minutesBefore === undefined ? '' : ` instead of ${durationWords(change.minutesBefore)}`
  const parts: string[] = []
  if (change.time) parts.push(`${voice.Your} at ${site} has a new time: ${facts.whenLocal}.`)
  if (change.length) parts.push(change.time ? `It will take ${facts.howLong}${before}.` : `${voice.Your} at ${site} will take ${facts.howLong}${before}. The time is the same.`)
  if (change.what) parts.push(parts.length ? 'What is planned for it has changed too.' : `What is planned for ${voice.your} at ${site} has changed. The time is the same.`)
  return parts.join(' ') || `The details of ${voice.your} at ${site} have changed.`
}

function wordingFor(kind: OutboxKind, context: MailContext, facts: VisitFacts, payload: OutboxPayload, voice: Voice): Wording {
  const site = context.site.name
  if (context.visit.state === 'cancelled') {
    return { subject: `Cancelled: ${voice.your} at ${site}, ${facts.shortWhen}`, intro: `${voice.Your} at ${site} has been cancelled. The time below is no longer held${voice.guardianLine ? '' : ' for you'}.` }
  }
  switch (kind) {
    case 'update':
      return { subject: `Changed: ${voice.your} at ${site}, ${facts.shortWhen}`, intro: changeWords(site, facts, payload.change, voice) }
    case 'reminder':
      return { subject: `Reminder: ${voice.your} at ${site}, ${facts.shortWhen}`, intro: `A reminder of ${voice.your.replace('dental visit', 'coming dental visit')} at ${site}.` }
    default:
      return { subject: `${voice.Your} at ${site}, ${facts.shortWhen}`, intro: `Thank you for booking with ${site}. ${voice.Your} is set for the time below.` }
  }
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (char) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[char]!)
}

function detailLines(context: MailContext, facts: VisitFacts): Array<[string, string]> {
  const { site } = context
  return [
    ['What', facts.what],
    ['When', `${facts.whenLocal} (${facts.zoneName})`],
    ['Plan for', facts.howLong],
    ['Where', [site.name, site.address].filter(Boolean).join(', ')],
    ['Phone', site.phone],
  ]
}

/** What the patient may still do: confirm only while booked, ask to cancel only once. */
function offers(context: MailContext) {
  const { visit } = context
  const live = visit.state === 'booked' || visit.state === 'confirmed'
  return { confirm: visit.state === 'booked', cancel: live && visit.cancelRequestedAt === null, confirmed: visit.state === 'confirmed' }
}

function whyLine(kind: OutboxKind, context: MailContext, voice: Voice): string {
  const site = context.site.name
  if (voice.guardianLine) return `You got this ${kind === 'reminder' ? 'reminder' : 'e-mail'} because ${voice.your.replace(/^the /, 'a ')} was booked at ${site} and you are named as the guardian.`
  return kind === 'reminder'
    ? `You got this reminder because you have a dental visit booked at ${site}.`
    : `You got this e-mail because a dental visit was booked for you at ${site}.`
}

function reachLine(context: MailContext): string {
  const { site } = context
  return [`To reach ${site.name}, call ${site.phone}`, site.email ? ` or write to ${site.email}` : '', '.'].join('')
}

function textBody(kind: OutboxKind, context: MailContext, facts: VisitFacts, wording: Wording, links: PatientLinks, recipient: Recipient, voice: Voice): string {
  const cancelled = context.visit.state === 'cancelled'
  const can = offers(context)
  const lines = [`Hello ${recipient.greeting},`, '', ...(voice.guardianLine ? [voice.guardianLine, ''] : []), wording.intro, '']
  for (const [label, value] of detailLines(context, facts)) lines.push(`${label}: ${value}`)
  lines.push('')
  if (cancelled) {
    lines.push(`To book a new time, call us at ${context.site.phone}.`)
  } else {
    lines.push(`Please bring ${facts.settings.whatToBring}.`, '')
    if (can.confirmed) lines.push('You have confirmed this visit. Thank you.')
    if (can.confirm) lines.push(`Confirm you are coming: ${links.confirm}`)
    if (can.cancel) lines.push(`Ask us to cancel: ${links.cancel}`)
    lines.push(`Your visit online: ${links.visitPage}`)
    lines.push(`Add it to your calendar (.ics): ${links.ics}`)
    lines.push(`To change the time, call us at ${context.site.phone}.`)
  }
  lines.push('', '--', context.site.name, context.site.address, context.site.phone, '', whyLine(kind, context, voice), reachLine(context))
  if (kind === 'reminder') lines.push(`Stop reminders by e-mail (you will still get changes and cancellations): ${links.stopReminders}`)
  return lines.filter((line, index, all) => !(line === '' && all[index - 1] === '')).join('\n')
}

/** The site's colour for the top bar, and a text colour that reads on it (WCAG 2.2 §1.4.3 contrast, roughly). */
function siteColours(colour: string): { background: string; text: string } {
  const background = /^#[0-9a-f]{6}$/i.test(colour) ? colour : '#1f6678'
  const [r, g, b] = [1, 3, 5].map((at) => Number.parseInt(background.slice(at, at + 2), 16) / 255) as [number, number, number]
  const light = 0.2126 * r + 0.7152 * g + 0.0722 * b > 0.55
  return { background, text: light ? '#1c1b19' : '#ffffff' }
}

function button(href: string, label: string, primary: boolean, colours: { background: string; text: string }): string {
  const style = primary
    ? `display:inline-block;background:${colours.background};color:${colours.text};padding:12px 18px;border-radius:6px;text-decoration:none;font-weight:600;margin:0 8px 8px 0`
    : 'display:inline-block;background:#ffffff;color:#1c1b19;border:1px solid #8a867d;padding:11px 17px;border-radius:6px;text-decoration:none;margin:0 8px 8px 0'
  return `<a href="${escapeHtml(href)}" style="${style}">${escapeHtml(label)}</a>`
}

function htmlBody(kind: OutboxKind, context: MailContext, facts: VisitFacts, wording: Wording, links: PatientLinks, recipient: Recipient, voice: Voice): string {
  const { site } = context
  const cancelled = context.visit.state === 'cancelled'
  const can = offers(context)
  const colours = siteColours(site.colour)
  const rows = detailLines(context, facts)
    .map(([label, value]) => `<tr><th align="left" valign="top" style="padding:4px 16px 4px 0;color:#5b5850;font-weight:600;white-space:nowrap">${escapeHtml(label)}</th><td style="padding:4px 0">${escapeHtml(value)}</td></tr>`)
    .join('')
  const buttons = [
    can.confirm ? button(links.confirm, 'Confirm I am coming', true, colours) : '',
    can.cancel ? button(links.cancel, 'Ask to cancel', false, colours) : '',
  ].join('')
  const actions = cancelled
    ? `<p>To book a new time, call us at ${escapeHtml(site.phone)}.</p>`
    : `<p>Please bring ${escapeHtml(facts.settings.whatToBring)}.</p>
${can.confirmed ? '<p>You have confirmed this visit. Thank you.</p>' : ''}
${buttons ? `<p style="margin:16px 0 8px">${buttons}</p>` : ''}
<p><a href="${escapeHtml(links.visitPage)}" style="color:#1f4f8a">Your visit online</a> &middot; <a href="${escapeHtml(links.ics)}" style="color:#1f4f8a">Add to your calendar (.ics)</a></p>
<p>To change the time, call us at ${escapeHtml(site.phone)}.</p>`
  const stop = kind === 'reminder'
    ? `<p style="margin:8px 0 0"><a href="${escapeHtml(links.stopReminders)}" style="color:#5b5850">Stop reminders by e-mail</a> (you will still get changes and cancellations).</p>`
    : ''
  return `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><meta name="color-scheme" content="light"><title>${escapeHtml(wording.subject)}</title></head>
<body style="margin:0;padding:0;background:#f4f2ee;font-family:Helvetica,Arial,sans-serif;color:#1c1b19;line-height:1.5;font-size:16px">
<div style="max-width:600px;margin:0 auto;background:#ffffff">
<div data-part="site" style="background:${colours.background};color:${colours.text};padding:14px 20px;font-size:18px;font-weight:600">${escapeHtml(site.name)}</div>
<div style="padding:16px 20px">
<p>Hello ${escapeHtml(recipient.greeting)},</p>
${voice.guardianLine ? `<p data-part="guardian">${escapeHtml(voice.guardianLine)}</p>\n` : ''}<p>${escapeHtml(wording.intro)}</p>
<table role="presentation" style="border-collapse:collapse;width:100%">${rows}</table>
${actions}
</div>
<div data-part="footer" style="padding:14px 20px;border-top:1px solid #e2ded6;color:#5b5850;font-size:14px">
<p style="margin:0 0 8px">${escapeHtml(site.name)}<br>${escapeHtml(site.address)}<br>${escapeHtml(site.phone)}</p>
<p style="margin:0">${escapeHtml(whyLine(kind, context, voice))} ${escapeHtml(reachLine(context))}</p>
${stop}
</div>
</div>
</body></html>`
}

export interface ComposedMessage {
  rendered: RenderedMessage
  mail: SendMailOptions
}

export interface ComposeOptions {
  from: string
  /** The site's calendar reply address (ORGANIZER). */
  organizerEmail: string
  /** Set once per outbox row (see dispatcher.ts); absent in previews. */
  messageId?: string
  payload?: OutboxPayload
}

export function composeMessage(kind: OutboxKind, context: MailContext, links: PatientLinks, options: ComposeOptions): ComposedMessage {
  const facts = visitFacts(context)
  // The guardian for a minor (the dispatcher has already skipped a message with nobody to send it to;
  // a preview of one shows the patient's own address, empty when there is none).
  const chosen = messageRecipient(context, 'email')
  const recipient: Recipient = 'skip' in chosen
    ? { to: '', name: `${context.patient.firstName} ${context.patient.lastName}`, greeting: context.patient.firstName, onBehalfOf: null }
    : chosen
  const voice = voiceOf(recipient)
  const wording = wordingFor(kind, context, facts, options.payload ?? {}, voice)
  // Reminders carry no calendar part: they are not invitations (RFC 5546 §3.2.2 would ask for a reply).
  const method = kind === 'reminder' && context.visit.state !== 'cancelled' ? null : methodFor(context)
  const ics = method ? visitCalendar(context, facts, method, { organizerEmail: options.organizerEmail }) : null
  const to = recipient.to
  const rendered: RenderedMessage = {
    to, subject: wording.subject, text: textBody(kind, context, facts, wording, links, recipient, voice), html: htmlBody(kind, context, facts, wording, links, recipient, voice), ics, method,
  }
  const headers: Record<string, string> = {
    // RFC 3834 §5: sent by a program, not a person; auto-responders stay quiet.
    'Auto-Submitted': 'auto-generated',
  }
  if (kind === 'reminder') {
    // RFC 8058 §3.1: one-click unsubscribe by POST; RFC 2369 §3.2 for the header itself.
    headers['List-Unsubscribe'] = `<${links.unsubscribePost}>`
    headers['List-Unsubscribe-Post'] = 'List-Unsubscribe=One-Click'
  }
  return {
    rendered,
    mail: {
      from: { name: context.site.name, address: options.from || context.site.email },
      replyTo: context.site.email || undefined,
      to: { name: recipient.name, address: to },
      subject: rendered.subject,
      text: rendered.text,
      html: rendered.html,
      // One calendar part only (RFC 6047 §2.4): a text/calendar; method=… alternative beside the text
      // and HTML. Not nodemailer's icalEvent, which adds an application/ics attachment as well.
      ...(ics && method ? { alternatives: [{ contentType: `text/calendar; charset=utf-8; method=${method}`, content: ics }] } : {}),
      headers,
      ...(options.messageId ? { messageId: options.messageId } : {}),
    },
  }
}
