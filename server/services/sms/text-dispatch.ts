// Sending one claimed outbox row of channel 'sms' through the SDK's messages.create. The claim,
// lease, backoff and give-up are the e-mail dispatcher's (../mail/dispatcher.ts); here: check again
// (number, consent, opt-out, the visit), wait out the site's quiet hours, render, send, store the
// message SID and status. The service then reports delivery to POST /api/sms/status. Waitlist offers
// and move offers (issue 17) are texted with the facts and signed link of their e-mails (`noticeText`).
import type { Db } from '../../utils/db'
import type { OutboxRow } from '../../repositories/outbox'
import { markFailed, markSkipped, payloadOf } from '../../repositories/outbox'
import { loadMailContext, type MailContext } from '../../repositories/mail-context'
import { deferText, findTextPatient, findTextSite, markTextSent, type TextPatient, type TextSite } from '../../repositories/sms'
import type { RenderedMessage } from '#shared/types/outbox'
import { toE164 } from '#shared/domain/sms-phone'
import { quietUntilMs } from '#shared/domain/sms-channels'
import { visitText, type TextKind } from '#shared/domain/sms-text'
import { mailSettingsOf } from '#shared/domain/site-settings'
import type { CountryCode } from 'libphonenumber-js'
import { smsConfig, useSmsClient, webhookUrlOf } from '../../utils/sms-client'
import { useLogger } from '../../utils/logger'
import { patientLinks, visitToken } from '../mail/links'
import { messageRecipient, visitFacts } from '../mail/visit-facts'
import { noticeText } from '../mail/notice-facts'
import { reasonToSkipForVisit, retryOrGiveUp, type DispatchRound, type DispatchSettings } from '../mail/dispatcher'
import { useVisitLinkSecret } from '../../utils/visit-link-secret'

const VISIT_KINDS = new Set<string>(['invitation', 'update', 'cancellation', 'reminder'])

interface TextTarget {
  site: TextSite
  context: MailContext | undefined
  patient: TextPatient | undefined
  to: string | null
  /** Why a message about the visit has nobody to go to (a minor without a guardian's number), or null. */
  noRecipient: string | null
  /** The guardian's name and the patient's, when a minor's message goes to the guardian. */
  guardian: { greeting: string; patientFirstName: string } | null
}

async function targetOf(db: Db, row: OutboxRow): Promise<TextTarget | string> {
  const payload = payloadOf(row)
  const context = row.visit_id === null ? undefined : await loadMailContext(db, row.visit_id)
  if (VISIT_KINDS.has(row.kind) && !context) return 'the visit no longer exists'
  const siteId = context?.site.id ?? row.site_id
  const site = siteId === null ? undefined : await findTextSite(db, siteId)
  if (!site) return 'the site no longer exists'
  const patient = context ? await findTextPatient(db, context.patient.id) : undefined
  const country = smsConfig().defaultCountry as CountryCode
  if (row.kind === 'reply_confirmation' && payload.to) return { site, context, patient, to: payload.to, noRecipient: null, guardian: null }
  // A message about a minor's visit goes to the guardian's number (shared/domain/message-recipient.ts).
  const recipient = context ? messageRecipient(context, 'sms') : null
  if (recipient && 'skip' in recipient) return { site, context, patient, to: null, noRecipient: recipient.skip, guardian: null }
  const guardian = recipient?.onBehalfOf && context ? { greeting: recipient.greeting, patientFirstName: context.patient.firstName } : null
  return { site, context, patient, to: toE164(recipient ? recipient.to : patient?.phone, country), noRecipient: null, guardian }
}

/** Why this text is not sent any more, or null to send it. */
function reasonToSkipText(row: OutboxRow, target: TextTarget, nowMs: number): string | null {
  const payload = payloadOf(row)
  if (target.noRecipient) return target.noRecipient
  if (!target.to) return target.guardian ? 'the guardian\'s number cannot take texts' : 'the patient has no mobile number that can take texts'
  // An answer goes back to the number that wrote to us; everything else needs the patient's consent.
  if (row.kind !== 'reply_confirmation') {
    if (!target.patient) return 'the patient no longer exists'
    if (!target.patient.smsConsent) return 'the patient has not agreed to texts'
    if (target.patient.smsOptedOutAt) return 'the patient replied STOP: no texts until they reply START'
  } else if (target.patient?.smsOptedOutAt && !payload.optOutNotice) {
    return 'the patient replied STOP: no texts until they reply START'
  }
  if (VISIT_KINDS.has(row.kind) && target.context) return reasonToSkipForVisit(row, target.context, nowMs)
  return null
}

function bodyOf(row: OutboxRow, target: TextTarget, settings: Pick<DispatchSettings, 'publicUrl' | 'linkSecret'>): string {
  const payload = payloadOf(row)
  if (!VISIT_KINDS.has(row.kind) || !target.context) return payload.body ?? ''
  const context = target.context
  const links = patientLinks(settings.publicUrl, visitToken(settings.linkSecret, context), context.visit.id)
  return visitText(row.kind as TextKind, {
    siteName: context.site.name, sitePhone: context.site.phone, when: visitFacts(context).shortWhen, link: links.visitPage,
    ...(target.guardian ? { guardian: target.guardian } : {}),
  })
}

function rendered(to: string, text: string): RenderedMessage {
  return { to, subject: '', text, html: '', ics: '', method: 'REQUEST' }
}

/** The service's 4xx answers (a number it refuses, an opted-out recipient) do not get better by retrying. */
function permanentFailure(error: unknown): string | null {
  const status = (error as { status?: unknown }).status
  const code = (error as { code?: unknown }).code
  if (typeof status === 'number' && status >= 400 && status < 500 && status !== 429) {
    return `the SMS service refused the text (${String(code ?? status)}): ${error instanceof Error ? error.message : String(error)}`
  }
  return null
}

/** A waitlist offer or a move offer (issue 17): no visit message, their own facts (`noticeText`). */
const NOTICE_KINDS = new Set<string>(['offer', 'move_offer'])

interface ReadyText { to: string; text: string; site: TextSite }

/** The text as it goes out now, or why it is not sent any more. */
async function readyText(db: Db, row: OutboxRow, settings: Pick<DispatchSettings, 'publicUrl' | 'linkSecret'>): Promise<ReadyText | { skip: string }> {
  if (NOTICE_KINDS.has(row.kind)) {
    const notice = await noticeText(db, row, settings)
    if ('skip' in notice) return notice
    const site = await findTextSite(db, notice.siteId)
    return site ? { to: notice.to, text: notice.text, site } : { skip: 'the site no longer exists' }
  }
  const target = await targetOf(db, row)
  const skip = typeof target === 'string' ? target : reasonToSkipText(row, target, Date.now())
  if (skip || typeof target === 'string') return { skip: skip ?? 'nothing to send' }
  return { to: target.to!, text: bodyOf(row, target, settings), site: target.site }
}

export async function sendTextRow(db: Db, row: OutboxRow, settings: DispatchSettings, round: DispatchRound): Promise<void> {
  let sent: { sid: string; status: string; rendered: RenderedMessage }
  try {
    const client = useSmsClient()
    if (!client) {
      await markSkipped(db, row, 'text messages are not set up (NUXT_SMS_ACCOUNT_SID)')
      round.skipped += 1
      return
    }
    const ready = await readyText(db, row, settings)
    if ('skip' in ready) {
      await markSkipped(db, row, ready.skip)
      round.skipped += 1
      return
    }
    // An answer to a reply goes at once (the patient just wrote); anything else waits out quiet hours
    // (an offer whose link closes meanwhile is then skipped as expired).
    if (row.kind !== 'reply_confirmation') {
      const quiet = mailSettingsOf(ready.site.settings).quietHours
      const until = quietUntilMs(Date.now(), quiet, ready.site.timeZone)
      if (until !== null) {
        await deferText(db, row, new Date(until), `quiet hours at the site: waits until ${quiet!.end}`)
        round.skipped += 1
        return
      }
    }
    const { from } = smsConfig()
    const message = await client.messages.create({
      to: ready.to, body: ready.text, statusCallback: webhookUrlOf('/api/sms/status'),
      ...(from.startsWith('MG') ? { messagingServiceSid: from } : { from }),
    })
    sent = { sid: message.sid, status: message.status, rendered: rendered(ready.to, ready.text) }
  } catch (error) {
    const permanent = permanentFailure(error)
    if (permanent) {
      await markFailed(db, row, permanent)
      round.failed += 1
    } else {
      await retryOrGiveUp(db, row, error, settings, round)
    }
    return
  }
  if (await markTextSent(db, row, sent.sid, sent.status, sent.rendered)) round.sent += 1
  else useLogger('outbox').warn(`text ${row.id} was sent but its lease had passed to another process`)
}

/** The Outbox screen's preview of a text not yet sent: as it would go out now. */
export async function textPreview(db: Db, row: OutboxRow): Promise<RenderedMessage | null> {
  const { mail } = useRuntimeConfig()
  const settings = { publicUrl: String(mail.publicUrl), linkSecret: useVisitLinkSecret() }
  if (NOTICE_KINDS.has(row.kind)) {
    const notice = await noticeText(db, row, settings)
    return 'skip' in notice ? null : rendered(notice.to, notice.text)
  }
  const target = await targetOf(db, row)
  if (typeof target === 'string' || !target.to) return null
  return rendered(target.to, bodyOf(row, target, settings))
}
