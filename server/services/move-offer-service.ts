// Move offers (issue 17 §3): Balance's "consolidate" suggestion sent to the patient as an offer, by
// e-mail and/or text (`offerChannels`). The visit moves only when the patient accepts on the page
// behind the link, through the booking service's one move (`moveInTransaction`: locks, overlap and
// hours checks, the change e-mail). If the
// time was taken meanwhile the patient hears so (409) and the visit stays. Declining or expiry leave
// the visit untouched. The link expires like a waitlist offer (site setting `offerHours`, never later
// than the notice before the earlier of the two times). Audit rows on entity `move_offer`.
import { randomBytes } from 'node:crypto'
import type { SessionUser } from '#shared/types/auth'
import type { PublicMoveOfferDto, SentMoveOfferDto, MoveOfferState } from '#shared/types/move-offer'
import type { SendMoveOfferInput } from '#shared/schemas/move-offer'
import { offerExpiresAtMs } from '#shared/domain/waitlist-match'
import { waitlistSettingsOf } from '#shared/domain/waitlist-settings'
import { canMove } from '#shared/domain/visit-states'
import { displayStyleOf, formatDateTime } from '#shared/utils/display-time'
import { localDateAt } from '#shared/utils/local-date'
import { useDb, type Db } from '../utils/db'
import { badRequest, conflict, notFound } from '../utils/errors'
import { requireSiteAccess } from '../utils/auth'
import { inTransaction } from '../utils/db-retry'
import { scheduleNowMs } from '../utils/clock'
import { useVisitLinkSecret } from '../utils/visit-link-secret'
import { offerSignatureValid, readOfferToken } from '../utils/offer-token'
import { findSiteDetail } from '../repositories/sites'
import { writeAudit } from '../repositories/audit-log'
import { enqueueMessages } from '../repositories/outbox'
import { findVisitRow, type VisitRow } from '../repositories/visits'
import { loadMailContext } from '../repositories/mail-context'
import { findMoveOffer, insertMoveOffer, setMoveOfferState, type MoveOfferRow } from '../repositories/move-offers'
import { moveInTransaction } from './booking-service'
import { offerChannels } from './sms/channels'

/** The notice a patient gets before the earlier of the two times: the link closes this long before it. */
export const MOVE_OFFER_NOTICE_MINUTES = 120

const LINK_NOT_VALID = 'This link is not valid. Please call the practice.'
const EXPIRED_MESSAGE = 'This offer has expired. Your visit stays at its current time.'
const PROBE_DONE = Symbol('probe rolled back')

function gone(message: string) {
  return createError({ statusCode: 410, statusMessage: 'Gone', message })
}

function isConflict(error: unknown): boolean {
  return (error as { statusCode?: number })?.statusCode === 409
}

/** The move, tried and rolled back: 409 from the booking rules when the time is not free now. */
async function probeMove(row: VisitRow, input: { startUtc: string; operatoryId: number; providerId: number }, userId: number): Promise<number> {
  let endMs = 0
  try {
    await inTransaction(async (trx) => {
      const moved = await moveInTransaction(trx, row, { ...input, rowVersion: row.row_version }, userId)
      endMs = Date.parse(moved.endUtc)
      throw PROBE_DONE
    })
  } catch (error) {
    if (error !== PROBE_DONE) throw error
  }
  return endMs
}

export async function sendMoveOffer(visitId: number, input: SendMoveOfferInput, user: SessionUser): Promise<SentMoveOfferDto> {
  const db = useDb()
  const row = await findVisitRow(db, visitId)
  if (!row) throw notFound('No such visit.')
  requireSiteAccess(user, row.site_id)
  if (!canMove(row.state)) throw conflict(`The visit is ${row.state}, so it can no longer be moved.`, { field: 'visit' })
  const nowMs = scheduleNowMs()
  const startMs = Date.parse(input.startUtc)
  if (startMs === row.start_utc.getTime() && (input.operatoryId ?? row.operatory_id) === row.operatory_id) throw badRequest('startUtc', 'is the visit\'s current time; propose another')
  const context = await loadMailContext(db, visitId)
  if (!context) throw notFound('No such visit.')
  // By e-mail and/or text, to the patient or a minor's guardian (on the visit's date, as `messageRecipient`).
  const { channels, why } = await offerChannels(db, 'move_offer', context.patient.id, context.site.settings, localDateAt(row.start_utc.getTime(), context.site.timeZone))
  if (!channels.length) throw conflict(`No move offer sent: ${why ?? 'no e-mail or text can reach the patient'}.`, { field: 'patient' })
  const { offerHours } = waitlistSettingsOf(context.site.settings)
  const expiresAtMs = offerExpiresAtMs({ nowMs, slotStartMs: Math.min(startMs, row.start_utc.getTime()), noticeMinutes: MOVE_OFFER_NOTICE_MINUTES, offerHours })
  if (expiresAtMs === null) throw conflict(`No move offer sent: the visit or the proposed time is less than ${MOVE_OFFER_NOTICE_MINUTES / 60} hours away.`, { field: 'startUtc' })
  const target = { startUtc: new Date(startMs).toISOString(), operatoryId: input.operatoryId ?? row.operatory_id, providerId: input.providerId ?? row.provider_id }
  const endMs = await probeMove(row, target, user.id)
  const moveOfferId = await inTransaction(async (trx) => {
    const id = await insertMoveOffer(trx, {
      visit_id: row.id, site_id: row.site_id, operatory_id: target.operatoryId, provider_id: target.providerId,
      from_start_utc: row.start_utc, start_utc: new Date(startMs), end_utc: new Date(endMs),
      nonce: randomBytes(24).toString('base64url'), expires_at: new Date(expiresAtMs), created_by: user.id,
    })
    await enqueueMessages(trx, channels.map((channel) => ({ kind: 'move_offer' as const, channel, visitId: row.id, siteId: row.site_id, dueAt: new Date(), payload: { moveOfferId: id } })))
    await writeAudit(trx, {
      userId: user.id, action: 'move_offer_sent', entity: 'move_offer', entityId: id,
      after: { visitId: row.id, fromStartUtc: row.start_utc.toISOString(), ...target, expiresAtUtc: new Date(expiresAtMs).toISOString(), channels },
    })
    return id
  })
  return { moveOfferId, visitId: row.id, startUtc: target.startUtc, expiresAtUtc: new Date(expiresAtMs).toISOString(), channels }
}

/** The move offer a token opens, or 404 (malformed, unknown, tampered, or a waitlist offer's link). */
async function moveOfferOfToken(db: Db, token: string): Promise<MoveOfferRow> {
  const parts = readOfferToken(token)
  if (!parts) throw notFound(LINK_NOT_VALID)
  const offer = await findMoveOffer(db, parts.offerId)
  if (!offer || !offerSignatureValid(useVisitLinkSecret(), token, offer.nonce, 'move-offer')) throw notFound(LINK_NOT_VALID)
  return offer
}

async function setStateWithAudit(db: Db, offer: MoveOfferRow, to: MoveOfferState, after: Record<string, unknown> = {}): Promise<boolean> {
  if (!(await setMoveOfferState(db, offer.id, 'sent', to))) return false
  await writeAudit(db, { userId: null, action: `move_offer_${to}`, entity: 'move_offer', entityId: offer.id, before: { state: 'sent' }, after: { state: to, visitId: offer.visit_id, ...after } })
  return true
}

/** An open offer past its expiry becomes 'expired' (with its audit row) when it is next looked at. */
async function expireIfDue(offer: MoveOfferRow): Promise<MoveOfferRow> {
  if (offer.state !== 'sent' || offer.expires_at.getTime() > scheduleNowMs()) return offer
  await inTransaction((trx) => setStateWithAudit(trx, offer, 'expired', { expiresAtUtc: offer.expires_at.toISOString() }))
  return (await findMoveOffer(useDb(), offer.id))!
}

async function stayMessage(db: Db, offer: MoveOfferRow): Promise<string> {
  const [site, visit] = await Promise.all([findSiteDetail(db, offer.site_id), findVisitRow(db, offer.visit_id)])
  const startMs = (visit?.start_utc ?? offer.from_start_utc).getTime()
  return site ? formatDateTime(startMs, displayStyleOf(site), 'long') : new Date(startMs).toISOString()
}

function messageFor(state: MoveOfferState, stays: string): string {
  switch (state) {
    case 'accepted': return 'Your visit has moved to the new time. You will get an e-mail with the details.'
    case 'declined': return `You kept your current time. Your visit stays at ${stays}.`
    case 'expired': return `${EXPIRED_MESSAGE.replace('its current time', stays)}`
    case 'taken': return `This time is no longer free; your visit stays at ${stays}.`
    default: return ''
  }
}

async function toPublic(db: Db, offer: MoveOfferRow): Promise<PublicMoveOfferDto> {
  const site = await findSiteDetail(db, offer.site_id)
  const visit = await findVisitRow(db, offer.visit_id)
  const current = offer.state === 'accepted' ? { start: offer.from_start_utc, end: null } : { start: visit?.start_utc ?? offer.from_start_utc, end: visit?.end_utc ?? null }
  const lengthMs = offer.end_utc.getTime() - offer.start_utc.getTime()
  const stays = await stayMessage(db, offer)
  return {
    siteName: site?.name ?? '', sitePhone: site?.phone ?? null, siteAddress: site?.address ?? null, timeZone: site?.timeZone ?? 'UTC',
    clock: site?.clock ?? '12h', dateOrder: site?.dateOrder ?? 'month-day-year',
    currentStartUtc: current.start.toISOString(), currentEndUtc: (current.end ?? new Date(current.start.getTime() + lengthMs)).toISOString(),
    startUtc: offer.start_utc.toISOString(), endUtc: offer.end_utc.toISOString(), expiresAtUtc: offer.expires_at.toISOString(),
    state: offer.state, message: messageFor(offer.state, stays),
  }
}

export async function publicMoveOffer(token: string): Promise<PublicMoveOfferDto> {
  const db = useDb()
  return toPublic(db, await expireIfDue(await moveOfferOfToken(db, token)))
}

/** The patient accepts: the visit moves through the booking service's move, or 409 with the visit unchanged, or 410 expired. */
export async function acceptMoveOffer(token: string): Promise<PublicMoveOfferDto> {
  const db = useDb()
  const offer = await expireIfDue(await moveOfferOfToken(db, token))
  if (offer.state === 'accepted') return toPublic(db, offer)
  if (offer.state === 'expired') throw gone(messageFor('expired', await stayMessage(db, offer)))
  if (offer.state !== 'sent') throw conflict(messageFor(offer.state, await stayMessage(db, offer)), { field: 'moveOffer' })
  const row = await findVisitRow(db, offer.visit_id)
  if (!row || !canMove(row.state) || row.start_utc.getTime() !== offer.from_start_utc.getTime()) {
    throw conflict(`Your visit has changed since this offer was sent, so it cannot be moved from this link. Your visit stays at ${await stayMessage(db, offer)}. Please call the practice.`, { field: 'visit' })
  }
  try {
    await inTransaction(async (trx) => {
      await moveInTransaction(trx, row, { startUtc: offer.start_utc.toISOString(), operatoryId: offer.operatory_id, providerId: offer.provider_id, rowVersion: row.row_version }, null)
      if (!(await setStateWithAudit(trx, offer, 'accepted', { fromStartUtc: offer.from_start_utc.toISOString(), startUtc: offer.start_utc.toISOString() }))) {
        throw conflict('This offer was already answered.', { field: 'moveOffer' })
      }
    })
  } catch (error) {
    if (!isConflict(error)) throw error
    const now = (await findMoveOffer(db, offer.id))!
    if (now.state === 'accepted') return toPublic(db, now)
    await inTransaction((trx) => setStateWithAudit(trx, offer, 'taken', { why: (error as Error).message }))
    throw conflict(messageFor('taken', await stayMessage(db, offer)), { field: 'moveOffer' })
  }
  return toPublic(db, (await findMoveOffer(db, offer.id))!)
}

/** The patient keeps the current time: the offer closes, the visit is untouched. */
export async function declineMoveOffer(token: string): Promise<PublicMoveOfferDto> {
  const db = useDb()
  const offer = await expireIfDue(await moveOfferOfToken(db, token))
  if (offer.state === 'sent') await inTransaction((trx) => setStateWithAudit(trx, offer, 'declined'))
  return toPublic(db, (await findMoveOffer(db, offer.id))!)
}
