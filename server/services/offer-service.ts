// Offers (issue 17 §2): a freed time e-mailed and/or texted to waiting patients (the channels each can
// be reached by, `offerChannels`); the first to accept on the offer
// page gets it, through the booking transaction (`bookInTransaction`), so several accepting at the
// same moment give one visit and "this time has just been taken" to the rest. An offer is open until
// its expiry (site setting, default 2 hours, never past the slot's start minus the patient's notice).
// Every offer, acceptance, expiry, "taken" and refusal writes an audit row on entity `offer`.
import { randomBytes } from 'node:crypto'
import type { SessionUser } from '#shared/types/auth'
import type { PublicOfferDto, SentOffersDto } from '#shared/types/waitlist'
import type { SendOffersInput } from '#shared/schemas/waitlist'
import { offerExpiresAtMs } from '#shared/domain/waitlist-match'
import { waitlistSettingsOf } from '#shared/domain/waitlist-settings'
import { patientMinutesOf } from '#shared/domain/patient-time'
import { localDateAt, localIsoAt } from '#shared/utils/local-date'
import { useDb, type Db } from '../utils/db'
import { conflict, notFound } from '../utils/errors'
import { inTransaction } from '../utils/db-retry'
import { scheduleNowMs } from '../utils/clock'
import { useVisitLinkSecret } from '../utils/visit-link-secret'
import { offerSignatureValid, readOfferToken } from '../utils/offer-token'
import { findSiteDetail } from '../repositories/sites'
import { writeAudit } from '../repositories/audit-log'
import { enqueueMessages } from '../repositories/outbox'
import { findEntry, findOffer, insertOffer, markOthersTaken, setOfferState, type OfferRow } from '../repositories/waitlist'
import { findVisit } from '../repositories/visits'
import { bookInTransaction } from './booking-service'
import { gapOf, matchesForOffers } from './waitlist-service'
import { offerChannels } from './sms/channels'

const MINUTE_MS = 60_000
const LINK_NOT_VALID = 'This link is not valid. Please call the practice.'
export const TAKEN_MESSAGE = 'Sorry, this time has just been taken by someone else. You stay on the waiting list, and we will write again when another time frees up.'
const EXPIRED_MESSAGE = 'This offer has expired, so the time can no longer be taken from this link. You stay on the waiting list.'

export async function sendOffers(input: SendOffersInput, user: SessionUser): Promise<SentOffersDto> {
  const db = useDb()
  const named = await gapOf(db, input, user)
  return inTransaction(async (trx) => {
    const wanted = new Set(input.entryIds)
    const { ctx, matches } = await matchesForOffers(trx, named, wanted)
    const { offerHours } = waitlistSettingsOf(ctx.calendar.settings)
    const nowMs = scheduleNowMs()
    const result: SentOffersDto = { sent: [], skipped: [] }
    const matched = new Map(matches.map((match) => [match.entry.id, match]))
    for (const entryId of wanted) {
      const match = matched.get(entryId)
      if (!match) {
        const entry = await findEntry(trx, entryId)
        const reason = !entry ? 'no such waitlist entry'
          : entry.siteId !== named.siteId && !entry.siteIds.includes(named.siteId) ? 'the patient does not accept this site'
          : entry.state !== 'open' ? `the entry is ${entry.state}`
          : named.startMs - entry.noticeMinutes * MINUTE_MS <= nowMs ? 'the time is too soon for the notice this patient needs'
          : 'the plan or the patient\'s wishes do not fit this time'
        result.skipped.push({ entryId, reason })
        continue
      }
      const { entry, opening } = match
      // By e-mail and/or text, as the patient (or a minor's guardian) can be reached; neither: not offered.
      const { channels, why } = await offerChannels(trx, 'offer', entry.patientId, ctx.calendar.settings, localDateAt(opening.startMs, ctx.gap.timeZone))
      if (!channels.length) {
        result.skipped.push({ entryId, reason: why ?? 'no e-mail or text can reach the patient' })
        continue
      }
      const expiresAtMs = offerExpiresAtMs({ nowMs, slotStartMs: opening.startMs, noticeMinutes: entry.noticeMinutes, offerHours })
      if (expiresAtMs === null) {
        result.skipped.push({ entryId, reason: 'the time is too soon for the notice this patient needs' })
        continue
      }
      const offerId = await insertOffer(trx, {
        entryId, siteId: opening.siteId, operatoryId: opening.operatoryId, providerId: opening.providerId,
        startMs: opening.startMs, endMs: opening.endMs, nonce: randomBytes(24).toString('base64url'), expiresAtMs, userId: user.id,
      })
      await enqueueMessages(trx, channels.map((channel) => ({ kind: 'offer' as const, channel, visitId: null, siteId: opening.siteId, dueAt: new Date(), payload: { offerId } })))
      await writeAudit(trx, {
        userId: user.id, action: 'offer_sent', entity: 'offer', entityId: offerId,
        after: { entryId, patientId: entry.patientId, siteId: opening.siteId, operatoryId: opening.operatoryId, providerId: opening.providerId, startUtc: new Date(opening.startMs).toISOString(), expiresAtUtc: new Date(expiresAtMs).toISOString(), channels },
      })
      result.sent.push({ offerId, entryId, expiresAtUtc: new Date(expiresAtMs).toISOString(), channels })
    }
    return result
  })
}

/** The offer a token opens, or 404 (malformed, unknown, tampered). */
async function offerOfToken(db: Db, token: string): Promise<OfferRow> {
  const parts = readOfferToken(token)
  if (!parts) throw notFound(LINK_NOT_VALID)
  const offer = await findOffer(db, parts.offerId)
  if (!offer || !offerSignatureValid(useVisitLinkSecret(), token, offer.nonce)) throw notFound(LINK_NOT_VALID)
  return offer
}

function gone(message: string) {
  return createError({ statusCode: 410, statusMessage: 'Gone', message })
}

/** An open offer past its expiry becomes 'expired' (with its audit row) when it is next looked at. */
async function expireIfDue(offer: OfferRow): Promise<OfferRow> {
  if (offer.state !== 'sent' || offer.expires_at.getTime() > scheduleNowMs()) return offer
  await inTransaction(async (trx) => {
    if (await setOfferState(trx, offer.id, 'sent', 'expired')) {
      await writeAudit(trx, { userId: null, action: 'offer_expired', entity: 'offer', entityId: offer.id, before: { state: 'sent' }, after: { state: 'expired', expiresAtUtc: offer.expires_at.toISOString() } })
    }
  })
  return (await findOffer(useDb(), offer.id))!
}

function messageFor(state: OfferRow['state']): string {
  switch (state) {
    case 'accepted': return 'This time is booked for you. You will get an e-mail with the details.'
    case 'taken': return TAKEN_MESSAGE
    case 'expired': return EXPIRED_MESSAGE
    case 'refused': return 'You said no to this time. You stay on the waiting list.'
    default: return ''
  }
}

async function toPublicOffer(db: Db, offer: OfferRow): Promise<PublicOfferDto> {
  const site = await findSiteDetail(db, offer.site_id)
  const visit = offer.visit_id ? await findVisit(db, offer.visit_id) : undefined
  const chairMinutes = Math.round((offer.end_utc.getTime() - offer.start_utc.getTime()) / MINUTE_MS)
  return {
    siteName: site?.name ?? '', sitePhone: site?.phone ?? null, siteAddress: site?.address ?? null, timeZone: site?.timeZone ?? 'UTC',
    clock: site?.clock ?? '12h', dateOrder: site?.dateOrder ?? 'month-day-year',
    startUtc: offer.start_utc.toISOString(), startLocalIso: localIsoAt(offer.start_utc.getTime(), site?.timeZone ?? 'UTC'),
    minutes: visit ? patientMinutesOf(visit.plan, chairMinutes) : chairMinutes,
    expiresAtUtc: offer.expires_at.toISOString(), state: offer.state, message: messageFor(offer.state),
  }
}

export async function publicOffer(token: string): Promise<PublicOfferDto> {
  const db = useDb()
  return toPublicOffer(db, await expireIfDue(await offerOfToken(db, token)))
}

function isConflict(error: unknown): boolean {
  return (error as { statusCode?: number })?.statusCode === 409
}

/** The patient accepts: booked through the booking transaction, or 409 "taken", or 410 expired. */
export async function acceptOffer(token: string): Promise<PublicOfferDto> {
  const db = useDb()
  const offer = await expireIfDue(await offerOfToken(db, token))
  if (offer.state === 'accepted') return toPublicOffer(db, offer)
  if (offer.state === 'expired') throw gone(EXPIRED_MESSAGE)
  if (offer.state === 'taken') throw conflict(TAKEN_MESSAGE, { field: 'offer' })
  if (offer.state === 'refused') throw conflict('You said no to this time; it can no longer be taken from this link. Please call the practice.', { field: 'offer' })
  try {
    await inTransaction(async (trx) => {
      const entry = await findEntry(trx, offer.entry_id)
      if (!entry) throw notFound(LINK_NOT_VALID)
      // No row lock on the offer before the booking locks (chair, provider, patient): the first to
      // get those books; the others then find the chair taken (409) and mark their own offer below.
      const visit = await bookInTransaction(trx, {
        patientId: entry.patientId, siteId: offer.site_id, operatoryId: offer.operatory_id, providerId: offer.provider_id,
        startUtc: offer.start_utc.toISOString(), items: entry.items, note: 'Booked by the patient from a waitlist offer',
      }, null)
      if (!(await setOfferState(trx, offer.id, 'sent', 'accepted', visit.id))) throw conflict(TAKEN_MESSAGE, { field: 'offer' })
      const others = await markOthersTaken(trx, offer)
      for (const otherId of others) {
        await writeAudit(trx, { userId: null, action: 'offer_taken', entity: 'offer', entityId: otherId, before: { state: 'sent' }, after: { state: 'taken', takenBy: offer.id } })
      }
      await writeAudit(trx, { userId: null, action: 'offer_accepted', entity: 'offer', entityId: offer.id, before: { state: 'sent' }, after: { state: 'accepted', visitId: visit.id, entryId: entry.id, othersTaken: others } })
    })
  } catch (error) {
    if (!isConflict(error)) throw error
    const now = (await findOffer(db, offer.id))!
    // A second press of the same link after the first booked it: the patient has the time.
    if (now.state === 'accepted') return toPublicOffer(db, now)
    await inTransaction(async (trx) => {
      if (await setOfferState(trx, offer.id, 'sent', 'taken')) {
        await writeAudit(trx, { userId: null, action: 'offer_taken', entity: 'offer', entityId: offer.id, before: { state: 'sent' }, after: { state: 'taken', why: (error as Error).message } })
      }
    })
    throw conflict(TAKEN_MESSAGE, { field: 'offer' })
  }
  return toPublicOffer(db, (await findOffer(db, offer.id))!)
}

/** The patient says no: the offer closes, the entry stays on the waitlist. */
export async function refuseOffer(token: string): Promise<PublicOfferDto> {
  const db = useDb()
  const offer = await expireIfDue(await offerOfToken(db, token))
  if (offer.state === 'sent') {
    await inTransaction(async (trx) => {
      if (await setOfferState(trx, offer.id, 'sent', 'refused')) {
        await writeAudit(trx, { userId: null, action: 'offer_refused', entity: 'offer', entityId: offer.id, before: { state: 'sent' }, after: { state: 'refused' } })
      }
    })
  }
  return toPublicOffer(db, (await findOffer(db, offer.id))!)
}
