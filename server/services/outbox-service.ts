// The Outbox screen: patient e-mails of the caller's sites, each as sent (or as it would be sent
// now), and "resend", which queues a fresh copy so the history of the first one stays.
import { VISIT_STATE_LABELS } from '#shared/domain/visit-states'
import type { SessionUser } from '#shared/types/auth'
import type { CancelRequestDto, OutboxDetailDto, OutboxMessageDto } from '#shared/types/outbox'
import type { OutboxQuery } from '#shared/schemas/outbox'
import { useDb } from '../utils/db'
import { conflict, notFound } from '../utils/errors'
import { requireSiteAccess } from '../utils/auth'
import { useVisitLinkSecret } from '../utils/visit-link-secret'
import { enqueueMessage, findOutboxListed, listOutbox, payloadOf, renderedOf } from '../repositories/outbox'
import { listCancelRequests, loadMailContext } from '../repositories/mail-context'
import { renderFor } from './mail/dispatcher'
import { textPreview } from './sms/text-dispatch'

export async function listMessages(query: OutboxQuery, user: SessionUser): Promise<OutboxMessageDto[]> {
  if (query.siteId !== undefined) requireSiteAccess(user, query.siteId)
  return listOutbox(useDb(), { ...query, siteIds: user.allSites ? 'all' : user.siteIds })
}

async function visibleMessage(id: number, user: SessionUser) {
  const found = await findOutboxListed(useDb(), id)
  if (!found) throw notFound('No such message.')
  if (found.row.site_id === null) {
    if (!user.allSites) throw notFound('No such message.')
  } else {
    requireSiteAccess(user, found.row.site_id)
  }
  return found
}

export async function messageDetail(id: number, user: SessionUser): Promise<OutboxDetailDto> {
  const { dto, row } = await visibleMessage(id, user)
  const stored = renderedOf(row)
  if (stored) return { ...dto, rendered: stored, preview: false }
  if (row.channel === 'sms') return { ...dto, rendered: await textPreview(useDb(), row), preview: true }
  // A queued move offer has no visit-mail preview (its link is signed when it is sent).
  const context = row.visit_id === null || row.kind === 'move_offer' ? undefined : await loadMailContext(useDb(), row.visit_id)
  if (!context || !context.patient.email) return { ...dto, rendered: null, preview: true }
  const { mail, smtp } = useRuntimeConfig()
  const composed = renderFor(row, context, { from: String(smtp.from ?? ''), publicUrl: String(mail.publicUrl), linkSecret: useVisitLinkSecret(), replyAddress: String(mail.replyAddress ?? '') })
  return { ...dto, rendered: composed.rendered, preview: true }
}

export async function resendMessage(id: number, user: SessionUser): Promise<OutboxMessageDto> {
  const { row } = await visibleMessage(id, user)
  if (row.visit_id === null || row.site_id === null) throw conflict('This message belongs to no visit and cannot be sent again.', { field: 'id' })
  if (row.state === 'queued' || row.state === 'sending') throw conflict('This message is still waiting to be sent.', { field: 'state', state: row.state })
  const db = useDb()
  const context = await loadMailContext(db, row.visit_id)
  if (!context) throw conflict('The visit of this message no longer exists.', { field: 'visitId' })
  // Only a cancellation goes out again for a visit that is over or cancelled: there is nothing to invite to or remind of.
  if (row.kind !== 'cancellation' && context.visit.state !== 'booked' && context.visit.state !== 'confirmed') {
    throw conflict(`The visit is ${VISIT_STATE_LABELS[context.visit.state].toLowerCase()}: this message is not sent again.`, { field: 'state', state: context.visit.state })
  }
  const payload = { ...payloadOf(row), visitId: row.visit_id, resendOf: row.id, startUtc: context.visit.startUtc.toISOString() }
  const newId = await enqueueMessage(db, { kind: row.kind, channel: row.channel, visitId: row.visit_id, siteId: row.site_id, dueAt: new Date(), payload })
  return (await findOutboxListed(db, newId))!.dto
}

export async function cancelRequests(siteId: number | undefined, user: SessionUser): Promise<CancelRequestDto[]> {
  if (siteId !== undefined) requireSiteAccess(user, siteId)
  return listCancelRequests(useDb(), { siteIds: user.allSites ? 'all' : user.siteIds, siteId, nowMs: Date.now() })
}
