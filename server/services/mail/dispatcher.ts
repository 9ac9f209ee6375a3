// One round of the outbox dispatcher: claim due rows (FOR UPDATE SKIP LOCKED, leased), check each
// again (consent, visit state, a reminder still for this start), send over SMTP, record the result.
// Rows of channel 'sms' go to the text sender (../sms/text-dispatch.ts) after the same claim.
// Failures wait with exponential backoff and jitter; after maxAttempts a row is 'failed'.
import type { Db } from '../../utils/db'
import { inTransaction } from '../../utils/db-retry'
import type { Transporter } from 'nodemailer'
import { retryDelaySeconds, givesUp, type RetryPolicy } from '#shared/domain/outbox-retry'
import { isClosed } from '#shared/domain/visit-states'
import { randomBytes } from 'node:crypto'
import { claimDueMessages, fixMessageId, markFailed, markRetry, markSent, markSkipped, payloadOf, type OutboxRow } from '../../repositories/outbox'
import { replyAddressOf } from '#shared/domain/reply-address'
import { loadMailContext, type MailContext } from '../../repositories/mail-context'
import { composeMessage, type ComposedMessage } from './compose'
import { patientLinks, visitToken } from './links'
import { useLogger } from '../../utils/logger'
import { sendTextRow } from '../sms/text-dispatch'
import { noticeMail } from './notice-facts'
import { messageRecipient } from './visit-facts'

export interface DispatchSettings {
  batchSize: number
  leaseSeconds: number
  lane: string
  retry: RetryPolicy
  from: string
  publicUrl: string
  linkSecret: string
  /** The calendar reply address template (`replies+{site}@…`); '' uses each site's own e-mail. */
  replyAddress: string
}

export interface DispatchRound {
  claimed: number
  sent: number
  skipped: number
  retried: number
  failed: number
}

/** Why a claimed message is not sent any more, or null to send it. */
export function reasonToSkip(row: OutboxRow, context: MailContext | undefined, nowMs: number): string | null {
  if (!context) return 'the visit no longer exists'
  const recipient = messageRecipient(context, 'email')
  if ('skip' in recipient) return recipient.skip
  if (!context.patient.emailConsent) return 'the patient has not agreed to e-mail'
  return reasonToSkipForVisit(row, context, nowMs)
}

/** The visit's side of it, the same for e-mail and texts: its state, a stale reminder, a start gone by. */
export function reasonToSkipForVisit(row: OutboxRow, context: MailContext, nowMs: number): string | null {
  const live = !isClosed(context.visit.state)
  if (row.kind === 'cancellation') {
    if (context.visit.state !== 'cancelled') return 'the visit is no longer cancelled'
    // A calendar entry for a time gone by needs no removing (mail held up by a long outage, say).
    return context.visit.endUtc.getTime() <= nowMs ? 'the visit time has passed' : null
  }
  if (!live) return `the visit is ${context.visit.state}`
  if (row.kind === 'reminder') {
    if (context.patient.remindersOffAt) return 'the patient turned reminders off'
    const payload = payloadOf(row)
    if (payload.startUtc && new Date(payload.startUtc).getTime() !== context.visit.startUtc.getTime()) return 'the visit moved; a new reminder was planned'
  }
  // An invitation, update or reminder that would arrive after the visit began only confuses.
  if (context.visit.startUtc.getTime() <= nowMs) return 'the visit has started'
  return null
}

/** The ORGANIZER of a site's events: its reply address, or the site's own e-mail without one. */
export function organizerOf(context: MailContext, replyAddress: string): string {
  return replyAddressOf(replyAddress, context.site.id) ?? context.site.email
}

type RenderSettings = Pick<DispatchSettings, 'from' | 'publicUrl' | 'linkSecret' | 'replyAddress'>

export function renderFor(row: OutboxRow, context: MailContext, settings: RenderSettings, messageId?: string) {
  const links = patientLinks(settings.publicUrl, visitToken(settings.linkSecret, context), context.visit.id)
  return composeMessage(row.kind, context, links, { from: settings.from, organizerEmail: organizerOf(context, settings.replyAddress), messageId, payload: payloadOf(row) })
}

/**
 * One Message-ID per outbox row (RFC 5322 §3.6.4), with a random part so that IDs from two databases
 * never meet; kept on the row before the first try, so a copy sent again after a crash carries the
 * same ID and mail systems that drop repeated IDs show the patient one message. A resend is a new row.
 */
function newMessageId(row: OutboxRow, sender: string): string {
  const domain = sender.split('@')[1]?.replace(/[^A-Za-z0-9.-]/g, '') || 'cuspline.invalid'
  return `<${row.id}.${randomBytes(12).toString('hex')}@${domain}>`
}

function describe(error: unknown): string {
  if (error instanceof Error) {
    const code = (error as { code?: unknown }).code
    return code ? `${String(code)}: ${error.message}` : error.message
  }
  return String(error)
}

export async function retryOrGiveUp(db: Db, row: OutboxRow, error: unknown, settings: DispatchSettings, round: DispatchRound): Promise<void> {
  const message = describe(error)
  if (givesUp(row.attempts, settings.retry)) {
    await markFailed(db, row, message)
    round.failed += 1
  } else {
    const waitMs = retryDelaySeconds(row.attempts, settings.retry, Math.random()) * 1000
    await markRetry(db, row, message, new Date(Date.now() + waitMs))
    round.retried += 1
  }
}

async function sendOne(db: Db, transporter: Transporter, row: OutboxRow, settings: DispatchSettings, round: DispatchRound): Promise<void> {
  let sent: { messageId: string; rendered: ComposedMessage['rendered'] }
  try {
    if (row.kind === 'offer' || row.kind === 'recall' || row.kind === 'move_offer') {
      // Waitlist offers and recalls (issue 17) have no visit: their own facts and composer.
      const notice = await noticeMail(db, row, settings)
      if ('skip' in notice) {
        await markSkipped(db, row, notice.skip)
        round.skipped += 1
        return
      }
      const messageId = row.message_id ?? newMessageId(row, settings.from || notice.siteEmail)
      if (!row.message_id && !(await fixMessageId(db, row, messageId))) return
      const composed = notice.compose(messageId)
      const info = await transporter.sendMail(composed.mail)
      sent = { messageId: String(info.messageId ?? ''), rendered: composed.rendered }
    } else {
    const context = row.visit_id === null ? undefined : await loadMailContext(db, row.visit_id)
    const skip = reasonToSkip(row, context, Date.now())
    if (skip) {
      await markSkipped(db, row, skip)
      round.skipped += 1
      return
    }
    const messageId = row.message_id ?? newMessageId(row, settings.from || context!.site.email)
    if (!row.message_id && !(await fixMessageId(db, row, messageId))) return
    const composed = renderFor(row, context!, settings, messageId)
    const info = await transporter.sendMail(composed.mail)
    sent = { messageId: String(info.messageId ?? ''), rendered: composed.rendered }
    }
  } catch (error) {
    await retryOrGiveUp(db, row, error, settings, round)
    return
  }
  // Sent: never scheduled again from here. If this update fails (or the process dies first), the row
  // stays 'sending' and is claimed again only after its lease: the one window where a message goes
  // out twice. The copy carries the same Message-ID (kept on the row before the first try), so a receiver that keeps one
  // message per ID delivers it once.
  if (await markSent(db, row, sent.messageId, sent.rendered)) round.sent += 1
  else useLogger('outbox').warn(`row ${row.id} was sent but its lease had passed to another process`)
}

export async function dispatchOnce(db: Db, transporter: Transporter, settings: DispatchSettings): Promise<DispatchRound> {
  // Claimed in one short transaction of its own; each send and its update then run outside it.
  const rows = await inTransaction((trx) => claimDueMessages(trx, { limit: settings.batchSize, leaseSeconds: settings.leaseSeconds, lane: settings.lane }))
  const round: DispatchRound = { claimed: rows.length, sent: 0, skipped: 0, retried: 0, failed: 0 }
  // One at a time over the pooled connection; a round ends well inside the lease.
  for (const row of rows) {
    if (row.channel === 'sms') await sendTextRow(db, row, settings, round)
    else await sendOne(db, transporter, row, settings, round)
  }
  return round
}
