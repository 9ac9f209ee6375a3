// Patient e-mails in the site's voice: text and HTML parts plus the calendar part. Only what the
// patient needs (practice, time, place, phone; HHS minimum necessary): no procedure, tooth or surface
// unless the site turns includeProcedureNames on.
import type { SendMailOptions } from 'nodemailer'
import type { OutboxKind, RenderedMessage } from '#shared/types/outbox'
import type { MailContext } from '../../repositories/mail-context'
import { visitFacts, type VisitFacts } from './visit-facts'
import { methodFor, visitCalendar } from './calendar'

export interface PatientLinks {
  visitPage: string
  ics: string
}

interface Wording {
  subject: string
  intro: string
}

function wordingFor(kind: OutboxKind, context: MailContext, facts: VisitFacts): Wording {
  const site = context.site.name
  if (context.visit.state === 'cancelled') {
    return { subject: `Cancelled: your dental visit at ${site}, ${facts.shortWhen}`, intro: `Your dental visit at ${site} has been cancelled. The time below is no longer held for you.` }
  }
  switch (kind) {
    case 'update':
      return { subject: `Changed: your dental visit at ${site}, ${facts.shortWhen}`, intro: `The time or place of your dental visit at ${site} has changed. Here are the new details.` }
    case 'reminder':
      return { subject: `Reminder: your dental visit at ${site}, ${facts.shortWhen}`, intro: `A reminder of your coming dental visit at ${site}.` }
    default:
      return { subject: `Your dental visit at ${site}, ${facts.shortWhen}`, intro: `Thank you for booking with ${site}. Your dental visit is set for the time below.` }
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

function textBody(context: MailContext, facts: VisitFacts, wording: Wording, links: PatientLinks): string {
  const cancelled = context.visit.state === 'cancelled'
  const lines = [`Hello ${context.patient.firstName},`, '', wording.intro, '']
  for (const [label, value] of detailLines(context, facts)) lines.push(`${label}: ${value}`)
  lines.push('')
  if (cancelled) {
    lines.push(`To book a new time, call us at ${context.site.phone}.`)
  } else {
    lines.push(`Please bring ${facts.settings.whatToBring}.`, '')
    lines.push(`Confirm your visit, or ask us to cancel it: ${links.visitPage}`)
    lines.push(`Add it to your calendar: ${links.ics}`)
    lines.push(`To cancel or change the time, use the link above or call us at ${context.site.phone}.`)
  }
  lines.push('', context.site.name, context.site.address, context.site.phone)
  return lines.filter((line, index, all) => !(line === '' && all[index - 1] === '')).join('\n')
}

function htmlBody(context: MailContext, facts: VisitFacts, wording: Wording, links: PatientLinks): string {
  const cancelled = context.visit.state === 'cancelled'
  const rows = detailLines(context, facts)
    .map(([label, value]) => `<tr><th align="left" valign="top" style="padding:4px 16px 4px 0;color:#5b5850;font-weight:600;white-space:nowrap">${escapeHtml(label)}</th><td style="padding:4px 0">${escapeHtml(value)}</td></tr>`)
    .join('')
  const actions = cancelled
    ? `<p>To book a new time, call us at ${escapeHtml(context.site.phone)}.</p>`
    : `<p>Please bring ${escapeHtml(facts.settings.whatToBring)}.</p>
<p><a href="${escapeHtml(links.visitPage)}" style="display:inline-block;background:#1f6678;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">Confirm or ask to cancel</a>
&nbsp; <a href="${escapeHtml(links.ics)}">Add to your calendar</a></p>
<p>To cancel or change the time, use the button above or call us at ${escapeHtml(context.site.phone)}.</p>`
  return `<!doctype html><html><body style="font-family:Helvetica,Arial,sans-serif;color:#1c1b19;line-height:1.5">
<p>Hello ${escapeHtml(context.patient.firstName)},</p>
<p>${escapeHtml(wording.intro)}</p>
<table style="border-collapse:collapse">${rows}</table>
${actions}
<p style="color:#5b5850">${escapeHtml(context.site.name)}<br>${escapeHtml(context.site.address)}<br>${escapeHtml(context.site.phone)}</p>
</body></html>`
}

export interface ComposedMessage {
  rendered: RenderedMessage
  mail: SendMailOptions
}

/**
 * One Message-ID per outbox row (RFC 5322 §3.6.4), unique beyond this database: the row's id and its
 * send key (given at its first claim, kept for every later try). Should a dispatcher die after the
 * SMTP server took a message but before it was marked sent, the copy sent again carries the same ID,
 * and servers that keep one message per ID (the local mail catcher) or mail systems that drop repeated
 * Message-IDs show the patient one message. A resend is a new row, a new ID.
 */
function messageIdOf(outboxId: number, sendKey: string | null, sender: string): string {
  const domain = sender.split('@')[1]?.replace(/[^A-Za-z0-9.-]/g, '') || 'cuspline.invalid'
  return `<outbox-${outboxId}${sendKey ? `.${sendKey.replace(/[^A-Za-z0-9]/g, '')}` : ''}@${domain}>`
}

export function composeMessage(kind: OutboxKind, context: MailContext, links: PatientLinks, from: string, outboxId?: number, sendKey: string | null = null): ComposedMessage {
  const facts = visitFacts(context)
  const wording = wordingFor(kind, context, facts)
  const method = methodFor(context)
  const ics = visitCalendar(context, facts, method)
  const to = context.patient.email ?? ''
  const rendered: RenderedMessage = { to, subject: wording.subject, text: textBody(context, facts, wording, links), html: htmlBody(context, facts, wording, links), ics, method }
  return {
    rendered,
    mail: {
      from: { name: context.site.name, address: from || context.site.email },
      replyTo: context.site.email || undefined,
      to: { name: `${context.patient.firstName} ${context.patient.lastName}`, address: to },
      subject: rendered.subject,
      text: rendered.text,
      html: rendered.html,
      // nodemailer adds this as a text/calendar; method=… alternative (RFC 6047 §2.4).
      icalEvent: { method, filename: method === 'CANCEL' ? 'cancelled-visit.ics' : 'visit.ics', content: ics },
      // Which outbox row and which dispatcher process sent it, for tracing a message back.
      headers: outboxId === undefined ? {} : { 'X-Cuspline-Outbox': String(outboxId), 'X-Cuspline-Dispatcher': String(process.pid) },
      ...(outboxId === undefined ? {} : { messageId: messageIdOf(outboxId, sendKey, from || context.site.email) }),
    },
  }
}
