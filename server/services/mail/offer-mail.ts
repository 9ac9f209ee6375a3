// The e-mail offering a freed time to a patient on the waitlist (issue 17 §2): plain text and HTML,
// no calendar part (nothing is booked until the patient accepts on the offer page).
import type { SendMailOptions } from 'nodemailer'
import type { RenderedMessage } from '#shared/types/outbox'
import type { SiteDetail } from '#shared/types/sites'
import { formatDateTime, zoneLabel } from '#shared/utils/display-time'

export interface OfferMailFacts {
  site: SiteDetail
  patient: { firstName: string; lastName: string; email: string }
  startMs: number
  expiresAtMs: number
  link: string
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (char) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[char]!)
}

export function composeOfferMail(facts: OfferMailFacts, options: { from: string; messageId?: string }): { rendered: RenderedMessage; mail: SendMailOptions } {
  const { site, patient } = facts
  const style = { timeZone: site.timeZone, clock: site.clock, dateOrder: site.dateOrder }
  const when = formatDateTime(facts.startMs, style, 'long')
  const until = formatDateTime(facts.expiresAtMs, style, 'short')
  const zone = zoneLabel(site.timeZone, facts.startMs)
  const subject = `An earlier time at ${site.name}: ${formatDateTime(facts.startMs, style, 'short')}`
  const intro = `A time has become free at ${site.name} and you are on our waiting list. The first person to accept it gets it.`
  const text = [
    `Hello ${patient.firstName},`, '', intro, '',
    `When: ${when} (${zone})`, `Where: ${[site.name, site.address].filter(Boolean).join(', ')}`, '',
    `To take this time, open: ${facts.link}`,
    `The offer is open until ${until}. If someone accepts first, you stay on the waiting list.`, '',
    `Questions? Call us at ${site.phone}.`, '',
    `You got this e-mail because you asked ${site.name} for an earlier time.`,
  ].join('\n')
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${escapeHtml(subject)}</title></head>
<body style="margin:0;padding:0;background:#f4f2ee;font-family:Helvetica,Arial,sans-serif;color:#1c1b19;line-height:1.5;font-size:16px">
<div style="max-width:600px;margin:0 auto;background:#ffffff">
<div data-part="site" style="background:${escapeHtml(site.colour)};color:#ffffff;padding:14px 20px;font-size:18px;font-weight:600">${escapeHtml(site.name)}</div>
<div style="padding:16px 20px">
<p>Hello ${escapeHtml(patient.firstName)},</p>
<p>${escapeHtml(intro)}</p>
<p><strong>${escapeHtml(when)}</strong> (${escapeHtml(zone)})<br>${escapeHtml([site.name, site.address].filter(Boolean).join(', '))}</p>
<p style="margin:16px 0"><a href="${escapeHtml(facts.link)}" style="display:inline-block;background:#1f4f8a;color:#ffffff;padding:12px 18px;border-radius:6px;text-decoration:none;font-weight:600">See the time and accept</a></p>
<p>The offer is open until ${escapeHtml(until)}. If someone accepts first, you stay on the waiting list.</p>
<p>Questions? Call us at ${escapeHtml(site.phone)}.</p>
</div>
<div data-part="footer" style="padding:14px 20px;border-top:1px solid #e2ded6;color:#5b5850;font-size:14px">
<p style="margin:0">You got this e-mail because you asked ${escapeHtml(site.name)} for an earlier time.</p>
</div></div></body></html>`
  const rendered: RenderedMessage = { to: patient.email, subject, text, html, ics: null, method: null }
  return {
    rendered,
    mail: {
      from: { name: site.name, address: options.from || site.email },
      replyTo: site.email || undefined,
      to: { name: `${patient.firstName} ${patient.lastName}`, address: patient.email },
      subject, text, html,
      headers: { 'Auto-Submitted': 'auto-generated' },
      ...(options.messageId ? { messageId: options.messageId } : {}),
    },
  }
}
